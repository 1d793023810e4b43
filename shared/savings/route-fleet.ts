// The peak fleet of each corridor route, period by period, before and after priority
// (fleet.ts): the headway from the route's trips through the corridor in the period, the round
// trip from the median scheduled trip of each direction starting in it, and what priority takes
// off the corridor's direction. Only a shorter scheduled round trip frees a bus.
import { DAY_TYPES, type DayType } from '../signals/time-of-day'
import type { FleetDto, FleetLine, FleetRouteDto } from '../schemas/savings'
import type { CorridorModel } from './corridor-model'
import { periodIndexAt } from './schedule-digest'
import { weightedMedian } from './reliability'
import { fleetEffect } from './fleet'

export function fleetFigures(m: CorridorModel, routeNames: ReadonlyMap<string, string> = new Map()): FleetDto[] {
  const { digest } = m
  const P = digest.periods.length
  // Trips (both directions) and corridor runs by route and period.
  const bucket = <T>() => Array.from({ length: digest.routes.length * P }, () => [] as T[])
  const tripsIn = { same: bucket<number>(), opposite: bucket<number>() }
  digest.trips.forEach((t, k) => {
    const p = periodIndexAt(digest.periods, t[3])
    if (p >= 0) tripsIn[t[1] === digest.directionId ? 'same' : 'opposite'][t[0] * P + p].push(k)
  })
  const runsIn = bucket<number>()
  m.runs.forEach((run, i) => { if (run.entryPeriod >= 0) runsIn[run.route * P + run.entryPeriod].push(i) })
  return DAY_TYPES.map((dayType: DayType, d) => {
    const routes: FleetRouteDto[] = []
    const perPeriod = Array.from({ length: P }, () => ({ without: 0, accepted: 0, proposed: 0 }))
    digest.routes.forEach((routeId, r) => {
      const lines: FleetLine[] = []
      for (let p = 0; p < P; p++) {
        let trips = 0
        const saved = { accepted: 0, proposed: 0 }
        for (const i of runsIn[r * P + p]) {
          const w = m.share[m.runs[i].service * 3 + d]
          trips += w
          saved.accepted += w * m.runSaving.accepted[i * 3 + d]
          saved.proposed += w * m.runSaving.proposed[i * 3 + d]
        }
        // Fewer than one bus in the period: no headway to speak of.
        if (trips < 1 - 1e-9) continue
        const duration = (dir: 'same' | 'opposite') => {
          const v: number[] = []
          const w: number[] = []
          for (const k of tripsIn[dir][r * P + p]) {
            const t = digest.trips[k]
            const share = m.share[t[2] * 3 + d]
            if (share > 0) { v.push(t[4]); w.push(share) }
          }
          return v.length ? weightedMedian(v, w) / 60 : null
        }
        const same = duration('same')
        if (same === null) continue
        const opposite = duration('opposite')
        const roundTripMin = same + (opposite ?? same)
        const headwayMin = m.periodMinutes[p] / trips
        const base = { roundTripMin, headwayMin, layoverShare: m.inputs.layoverShare }
        const acc = fleetEffect({ ...base, savedMin: saved.accepted / trips / 60 })
        const prop = fleetEffect({ ...base, savedMin: saved.proposed / trips / 60 })
        lines.push({
          routeId, periodId: digest.periods[p].id, periodName: digest.periods[p].name, dayType, headwayMin, roundTripMin,
          oppositeAssumed: opposite === null,
          cycleMin: { without: acc.cycleBeforeMin, accepted: acc.cycleAfterMin, proposed: prop.cycleAfterMin },
          vehicles: { without: acc.before, accepted: acc.after, proposed: prop.after },
        })
        perPeriod[p].without += acc.before
        perPeriod[p].accepted += acc.after
        perPeriod[p].proposed += prop.after
      }
      const peak = (k: 'without' | 'accepted' | 'proposed') => Math.max(0, ...lines.map((l) => l.vehicles[k]))
      if (lines.length) routes.push({ routeId, routeName: routeNames.get(routeId) ?? routeId, peak: { without: peak('without'), accepted: peak('accepted'), proposed: peak('proposed') }, lines })
    })
    const peak = (k: 'without' | 'accepted' | 'proposed') => Math.max(0, ...perPeriod.map((x) => x[k]))
    const total = { without: peak('without'), accepted: peak('accepted'), proposed: peak('proposed') }
    return { dayType, routes, peak: total, busSaved: { accepted: total.accepted < total.without, proposed: total.proposed < total.without } }
  })
}

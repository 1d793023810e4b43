// What the schedule says about a corridor: scheduled run time between consecutive corridor stops
// (median over the trips that serve both), bus trips per hour by period and day type, and the time
// each trip passes a point along the corridor. Times are seconds since "noon minus 12 h" of the
// service day (GTFS); trips run past midnight with times above 86 400 s.
import { inWindow, DAY_TYPES, type DayType, type TimeWindow } from '../signals/time-of-day'
import { zeroPerDayType, type PerDayType } from './day-types'

/** One run of a trip over the corridor (a frequencies.txt template gives one run per start). */
export interface CorridorRun {
  tripId: string
  routeId: string
  serviceId: string
  /** Seconds added to the trip's stop times (frequency-based runs), else 0. */
  shiftS: number
  /** The corridor stops it serves, in corridor order: index into the corridor's stop list. */
  passes: readonly { stop: number; arrivalS: number; departureS: number }[]
}

export function median(values: readonly number[]): number | null {
  if (!values.length) return null
  const v = [...values].sort((a, b) => a - b)
  const m = v.length >> 1
  return v.length % 2 ? v[m] : (v[m - 1] + v[m]) / 2
}

export interface RunTime { fromStop: number; toStop: number; medianS: number | null; trips: number }

/** Scheduled running time from departure at stop i to arrival at stop i + 1, median over runs serving both. */
export function runTimesBetweenStops(runs: readonly CorridorRun[], stopCount: number): RunTime[] {
  const samples: number[][] = Array.from({ length: Math.max(0, stopCount - 1) }, () => [])
  for (const r of runs) {
    for (let k = 1; k < r.passes.length; k++) {
      const a = r.passes[k - 1], b = r.passes[k]
      if (b.stop === a.stop + 1) samples[a.stop].push(b.arrivalS - a.departureS)
    }
  }
  return samples.map((s, i) => ({ fromStop: i, toStop: i + 1, medianS: median(s), trips: s.length }))
}

/** When a run enters the corridor: departure from the first corridor stop it serves (plus its shift). */
export function corridorEntryS(run: CorridorRun): number {
  return run.passes[0].departureS + run.shiftS
}

export const minuteOfDay = (gtfsSeconds: number) => (((Math.floor(gtfsSeconds / 60)) % 1440) + 1440) % 1440

export interface PeriodTrips { periodId: string; dayType: DayType; tripsPerDay: number; tripsPerHour: number }

/**
 * Average bus trips per day and per hour of each period on each day type. A run counts in the
 * period that contains its corridor entry time (times past midnight wrap into the clock day), and
 * by how often its service runs on that day type (`share`).
 */
export function tripsByPeriod(
  runs: readonly CorridorRun[], share: (serviceId: string) => PerDayType,
  periods: readonly (TimeWindow & { id: string; minutes: number })[],
): PeriodTrips[] {
  const perDay = new Map(periods.map((p) => [p.id, zeroPerDayType()]))
  for (const r of runs) {
    const m = minuteOfDay(corridorEntryS(r))
    const p = periods.find((x) => inWindow(x, m))
    if (!p) continue
    const s = share(r.serviceId)
    const acc = perDay.get(p.id)!
    for (const d of DAY_TYPES) acc[d] += s[d]
  }
  return periods.flatMap((p) => DAY_TYPES.map((dayType) => {
    const tripsPerDay = perDay.get(p.id)![dayType]
    return { periodId: p.id, dayType, tripsPerDay, tripsPerHour: p.minutes ? tripsPerDay / (p.minutes / 60) : 0 }
  }))
}

/** Average trips entering the corridor in each clock hour (0-23) of each day type. */
export function hourlyTrips(runs: readonly CorridorRun[], share: (serviceId: string) => PerDayType): Record<DayType, number[]> {
  const out = { weekday: new Array(24).fill(0), saturday: new Array(24).fill(0), sunday: new Array(24).fill(0) } as Record<DayType, number[]>
  for (const r of runs) {
    const h = Math.floor(minuteOfDay(corridorEntryS(r)) / 60)
    const s = share(r.serviceId)
    for (const d of DAY_TYPES) out[d][h] += s[d]
  }
  return out
}

/**
 * The time (GTFS seconds, shift included) the run passes `distanceM` along the corridor: linear
 * between the departure from the stop before and the arrival at the stop after, the dwell
 * included at the stops themselves. Null outside the stretch the run serves.
 */
export function timeAtDistance(run: CorridorRun, stopDistancesM: readonly number[], distanceM: number): number | null {
  const p = run.passes
  if (!p.length) return null
  const first = stopDistancesM[p[0].stop], last = stopDistancesM[p[p.length - 1].stop]
  if (distanceM < first || distanceM > last) return null
  for (let k = 0; k < p.length; k++) {
    const d = stopDistancesM[p[k].stop]
    if (distanceM === d) return p[k].departureS + run.shiftS
    if (k + 1 < p.length) {
      const d2 = stopDistancesM[p[k + 1].stop]
      if (distanceM > d && distanceM < d2) {
        const f = (distanceM - d) / (d2 - d)
        return p[k].departureS + f * (p[k + 1].arrivalS - p[k].departureS) + run.shiftS
      }
    }
  }
  return p[p.length - 1].arrivalS + run.shiftS
}

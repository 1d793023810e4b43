// Savings per trip, per day (by day type), per year, per intersection, per period and per hour,
// and the person-delay balance with the cross streets, from the corridor model. An average day
// of a type counts each run by how often its service runs on such days; a year counts it on
// the days its service runs in the 12 months (see annual.ts).
import { DAY_TYPES, type DayType } from '../signals/time-of-day'
import { minuteOfDay } from '../corridors/schedule'
import type {
  DayFigures, HourPoint, IntersectionSavingsDto, PeriodSavingsDto, PersonDelayBalance, Scenario, ScenarioDay, ScenarioYear,
} from '../schemas/savings'
import type { CorridorModel } from './corridor-model'

const SCENARIOS: Scenario[] = ['accepted', 'proposed']
const ratio = (a: number, b: number) => (b > 0 ? a / b : 0)

function cost(m: CorridorModel, vehicleHours: number): number | null {
  return m.inputs.costPerRevenueHour === null ? null : vehicleHours * m.inputs.costPerRevenueHour
}

/** Totals over the runs that pass `keep`, on an average day of type d. */
function dayTotals(m: CorridorModel, d: number, keep: (runIndex: number) => boolean) {
  let trips = 0
  let runTime = 0
  const saved = { accepted: 0, proposed: 0 }
  const pax = { accepted: 0, proposed: 0 }
  m.runs.forEach((run, i) => {
    const w = m.share[run.service * 3 + d]
    if (!w || !keep(i)) return
    trips += w
    runTime += w * (run.exitS - run.entryS)
    for (const sc of SCENARIOS) {
      saved[sc] += w * m.runSaving[sc][i * 3 + d]
      pax[sc] += w * m.runPassengerSaving[sc][i * 3 + d]
    }
  })
  return { trips, runTimeS: ratio(runTime, trips), saved, pax }
}

export function dayFigures(m: CorridorModel): DayFigures[] {
  return DAY_TYPES.map((dayType, d) => {
    const t = dayTotals(m, d, () => true)
    const scenario = (sc: Scenario): ScenarioDay => {
      const vehicleHours = t.saved[sc] / 3600
      const savingPerTripS = ratio(t.saved[sc], t.trips)
      return { savingPerTripS, shareOfRunTime: ratio(savingPerTripS, t.runTimeS), vehicleHours, passengerHours: t.pax[sc] / 3600, cost: cost(m, vehicleHours) }
    }
    return { dayType, trips: t.trips, runTimeS: t.runTimeS, accepted: scenario('accepted'), proposed: scenario('proposed') }
  })
}

/** Person-hours on an average day of each type: bus riders saved, car occupants of both streets. */
export function personDelay(m: CorridorModel): Record<DayType, Record<Scenario, PersonDelayBalance>> {
  const P = m.digest.periods.length
  const out = {} as Record<DayType, Record<Scenario, PersonDelayBalance>>
  DAY_TYPES.forEach((dayType, d) => {
    const t = dayTotals(m, d, () => true)
    const cars = { accepted: { main: 0, cross: 0 }, proposed: { main: 0, cross: 0 } }
    m.rowAt.forEach((row, a) => {
      if (!row) return
      for (let p = 0; p < P; p++) {
        const f = m.figure(a, p, d)
        if (!f) continue
        const hours = m.periodMinutes[p] / 60
        for (const sc of SCENARIOS) {
          if (sc === 'accepted' && row.status !== 'accepted') continue
          cars[sc].main += f.mainSavedPersonSPerHour * hours
          cars[sc].cross += f.crossLostPersonSPerHour * hours
        }
      }
    })
    const balance = (sc: Scenario): PersonDelayBalance => {
      const busPassengersSaved = t.pax[sc] / 3600
      const mainStreetOccupantsSaved = cars[sc].main / 3600
      const crossStreetOccupantsLost = cars[sc].cross / 3600
      return { busPassengersSaved, mainStreetOccupantsSaved, crossStreetOccupantsLost, balance: busPassengersSaved + mainStreetOccupantsSaved - crossStreetOccupantsLost }
    }
    out[dayType] = { accepted: balance('accepted'), proposed: balance('proposed') }
  })
  return out
}

/** The 12 months: each run on the days its service runs; people on cars by the days of each type. */
export function annualFigures(m: CorridorModel, balance: Record<DayType, Record<Scenario, PersonDelayBalance>>): { trips: number } & Record<Scenario, ScenarioYear> {
  let trips = 0
  const saved = { accepted: 0, proposed: 0 }
  const pax = { accepted: 0, proposed: 0 }
  m.runs.forEach((run, i) => {
    for (let d = 0; d < 3; d++) {
      const n = m.annualDays[run.service * 3 + d]
      if (!n) continue
      trips += n
      for (const sc of SCENARIOS) {
        saved[sc] += n * m.runSaving[sc][i * 3 + d]
        pax[sc] += n * m.runPassengerSaving[sc][i * 3 + d]
      }
    }
  })
  const year = (sc: Scenario): ScenarioYear => {
    const vehicleHours = saved[sc] / 3600
    const personHoursBalance = DAY_TYPES.reduce((s, t) => s + m.year.daysOfType[t] * (balance[t][sc].balance - balance[t][sc].busPassengersSaved), 0) + pax[sc] / 3600
    return { vehicleHours, passengerHours: pax[sc] / 3600, cost: cost(m, vehicleHours), personHoursBalance }
  }
  return { trips, accepted: year('accepted'), proposed: year('proposed') }
}

export function intersectionFigures(m: CorridorModel): Record<DayType, IntersectionSavingsDto[]> {
  const P = m.digest.periods.length
  const approachOf = new Map(m.digest.approachIds.map((id, a) => [id, a]))
  const rows = [...m.rows].sort((x, y) => x.position - y.position)
  // One pass over the runs per row gives every day type at once.
  const sums = rows.map((row) => {
    const a = row.approachId ? approachOf.get(row.approachId) ?? -1 : -1
    const buses = new Float64Array(3)
    const perDay = { accepted: new Float64Array(3), proposed: new Float64Array(3) }
    const perYear = { accepted: 0, proposed: 0 }
    const pax = new Float64Array(3)
    if (a >= 0) {
      for (const run of m.runs) {
        const p = run.periods[a]
        if (p < 0) continue
        const k = (a * P + p) * 3
        const load = m.loads[run.route * P + p]
        for (let d = 0; d < 3; d++) {
          const w = m.share[run.service * 3 + d]
          const n = m.annualDays[run.service * 3 + d]
          const acc = m.saving.accepted[k + d]
          const prop = m.saving.proposed[k + d]
          buses[d] += w
          perDay.accepted[d] += w * acc
          perDay.proposed[d] += w * prop
          perYear.accepted += n * acc
          perYear.proposed += n * prop
          pax[d] += w * prop * load
        }
      }
    }
    return { row, a, buses, perDay, perYear, pax }
  })
  const out = {} as Record<DayType, IntersectionSavingsDto[]>
  DAY_TYPES.forEach((dayType, d) => {
    out[dayType] = sums.map(({ row, a, buses, perDay, perYear, pax }) => {
      let crossWorst = 0
      let cars = 0
      let missing = 0
      for (let p = 0; p < P; p++) {
        const f = a >= 0 ? m.figure(a, p, d) : undefined
        if (!f) { missing++; continue }
        crossWorst = Math.max(crossWorst, f.crossExtraDelayPerVehS)
        cars += (f.mainSavedPersonSPerHour - f.crossLostPersonSPerHour) * (m.periodMinutes[p] / 60)
      }
      return {
        rowId: row.rowId, position: row.position, intersectionId: row.intersectionId, intersectionName: row.intersectionName,
        jurisdictionName: row.jurisdictionName, status: row.status, distanceM: row.distanceM, buses: buses[d],
        savingPerBusS: ratio(perDay.proposed[d], buses[d]),
        acceptedVehicleHoursPerDay: perDay.accepted[d] / 3600, proposedVehicleHoursPerDay: perDay.proposed[d] / 3600,
        acceptedVehicleHoursPerYear: perYear.accepted / 3600, proposedVehicleHoursPerYear: perYear.proposed / 3600,
        crossExtraDelayPerVehS: crossWorst, personHoursBalance: (pax[d] + cars) / 3600, periodsMissing: missing, stale: row.stale,
      }
    })
  })
  return out
}

/** By the period in which each trip enters the corridor. */
export function periodFigures(m: CorridorModel): PeriodSavingsDto[] {
  return DAY_TYPES.flatMap((dayType, d) => m.digest.periods.map((period, p) => {
    const t = dayTotals(m, d, (i) => m.runs[i].entryPeriod === p)
    return {
      periodId: period.id, periodName: period.name, startTime: period.startTime, endTime: period.endTime, dayType,
      trips: t.trips, runTimeS: t.runTimeS,
      acceptedSavingPerTripS: ratio(t.saved.accepted, t.trips), proposedSavingPerTripS: ratio(t.saved.proposed, t.trips),
      acceptedVehicleHours: t.saved.accepted / 3600, proposedVehicleHours: t.saved.proposed / 3600,
      acceptedPassengerHours: t.pax.accepted / 3600, proposedPassengerHours: t.pax.proposed / 3600,
    }
  }))
}

/** Mean scheduled run time through the day, by the clock hour of entry, with and without priority. */
export function hourlyFigures(m: CorridorModel): Record<DayType, HourPoint[]> {
  const out = {} as Record<DayType, HourPoint[]>
  DAY_TYPES.forEach((dayType, d) => {
    const acc = Array.from({ length: 24 }, () => ({ trips: 0, run: 0, accepted: 0, proposed: 0 }))
    m.runs.forEach((run, i) => {
      const w = m.share[run.service * 3 + d]
      if (!w) return
      const h = acc[Math.floor(minuteOfDay(run.entryS) / 60)]
      h.trips += w
      h.run += w * (run.exitS - run.entryS)
      h.accepted += w * m.runSaving.accepted[i * 3 + d]
      h.proposed += w * m.runSaving.proposed[i * 3 + d]
    })
    out[dayType] = acc.flatMap((h, hour) => (h.trips > 0 ? [{
      hour, trips: h.trips, scheduledS: h.run / h.trips, acceptedS: (h.run - h.accepted) / h.trips, proposedS: (h.run - h.proposed) / h.trips,
    }] : []))
  })
  return out
}

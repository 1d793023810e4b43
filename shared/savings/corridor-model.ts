// The corridor's schedule digest joined with the stored results of a proposal's rows: for
// every run and day type, what it saves through the corridor (the sum over the intersections it
// crosses of the row's expected saving in the period of the crossing), in two scenarios: only
// the rows the cities agreed, and every row as proposed. The other figures are sums of these.
import { DAY_TYPES, windowMinutes, type DayType } from '../signals/time-of-day'
import { zeroPerDayType, type PerDayType } from '../corridors/day-types'
import type { RowStatus } from '../schemas/proposals'
import type { SavingsInputs, Scenario } from '../schemas/savings'
import { decodePeriod, periodIndexAt, type ScheduleDigest } from './schedule-digest'
import { averageDayShares, serviceYear, type ServiceYear } from './annual'
import { loadOf } from './inputs'

/** The model's figures for one row in one period and day type. */
export interface PeriodFigures {
  savingPerTripS: number
  crossExtraDelayPerVehS: number
  /** Person-seconds per hour at the evaluated bus rate (cars on the bus street, cars on the cross street). */
  mainSavedPersonSPerHour: number
  crossLostPersonSPerHour: number
  /** The model's bus delay by arrival phase, for the delay distribution; empty when not stored. */
  phases: readonly { baselineS: number; priorityS: number }[]
  /** Share of buses that ask and are not locked out. */
  priorityWeight: number
}

export interface RowFigures {
  rowId: string
  position: number
  intersectionId: string
  intersectionName: string
  jurisdictionName: string
  status: RowStatus
  approachId: string | null
  distanceM: number | null
  /** The settings changed since the figures were computed. */
  stale: boolean
  /** Keyed `${periodId}|${dayType}`; null where the period could not be evaluated, absent where it was not. */
  results: Record<string, PeriodFigures | null>
}

export const resultKey = (periodId: string, dayType: DayType) => `${periodId}|${dayType}`

export interface DecodedRun {
  route: number
  service: number
  entryS: number
  exitS: number
  /** Period of each approach crossing, -1 where not crossed. */
  periods: Int8Array
  entryPeriod: number
  /** Crosses every approach of the corridor. */
  full: boolean
}

export interface CorridorModel {
  digest: ScheduleDigest
  rows: readonly RowFigures[]
  inputs: SavingsInputs
  year: ServiceYear
  runs: DecodedRun[]
  /** How often service s runs on an average day of type d: index s * 3 + d. */
  share: Float64Array
  /** Days service s runs in the 12 months on days of type d: index s * 3 + d. */
  annualDays: Float64Array
  periodMinutes: number[]
  /** The row at each approach of the digest (null: no row of the proposal there). */
  rowAt: (RowFigures | null)[]
  /** figure(a, p, d): the figures of the row at approach a, period p, day type d. */
  figure(a: number, p: number, d: number): PeriodFigures | null | undefined
  /** Saving per crossing, by scenario: index (a * P + p) * 3 + d. */
  saving: Record<Scenario, Float64Array>
  /** Load of route r in period p: index r * P + p. */
  loads: Float64Array
  /** Per run, by scenario, index run * 3 + d: seconds saved and passenger-seconds saved. */
  runSaving: Record<Scenario, Float64Array>
  runPassengerSaving: Record<Scenario, Float64Array>
}

export const DAY_INDEX: Record<DayType, number> = { weekday: 0, saturday: 1, sunday: 2 }

export function buildCorridorModel(digest: ScheduleDigest, rows: readonly RowFigures[], inputs: SavingsInputs, referenceDay: number): CorridorModel {
  const P = digest.periods.length
  const A = digest.approachIds.length
  const dates = new Map(Object.entries(digest.serviceDates))
  const year = serviceYear(dates, digest.feedRange, referenceDay)
  const shares = digest.feedRange ? averageDayShares(dates, digest.feedRange) : new Map<string, PerDayType>()
  const byDayType = (of: (id: string) => PerDayType | undefined) => {
    const out = new Float64Array(digest.services.length * 3)
    digest.services.forEach((id, s) => { const v = of(id) ?? zeroPerDayType(); DAY_TYPES.forEach((t, d) => { out[s * 3 + d] = v[t] }) })
    return out
  }
  const share = byDayType((id) => shares.get(id))
  const annualDays = byDayType((id) => year.perService.get(id))

  const runs: DecodedRun[] = digest.runs.map(([route, service, entryS, exitS, code]) => {
    const periods = new Int8Array(code.length)
    for (let a = 0; a < code.length; a++) periods[a] = decodePeriod(code[a])
    return { route, service, entryS, exitS, periods, entryPeriod: periodIndexAt(digest.periods, entryS), full: periods.every((p) => p >= 0) }
  })

  const byApproach = new Map(rows.filter((r) => r.approachId).map((r) => [r.approachId!, r]))
  const rowAt = digest.approachIds.map((id) => byApproach.get(id) ?? null)
  const figs: (PeriodFigures | null | undefined)[] = new Array(A * P * 3)
  const saving = { accepted: new Float64Array(A * P * 3), proposed: new Float64Array(A * P * 3) }
  rowAt.forEach((row, a) => {
    if (!row) return
    digest.periods.forEach((period, p) => {
      DAY_TYPES.forEach((dayType, d) => {
        const f = row.results[resultKey(period.id, dayType)]
        const k = (a * P + p) * 3 + d
        figs[k] = f
        if (!f) return
        saving.proposed[k] = f.savingPerTripS
        if (row.status === 'accepted') saving.accepted[k] = f.savingPerTripS
      })
    })
  })

  const loads = new Float64Array(digest.routes.length * P)
  digest.routes.forEach((routeId, r) => digest.periods.forEach((period, p) => { loads[r * P + p] = loadOf(inputs, routeId, period.name) }))

  const runSaving = { accepted: new Float64Array(runs.length * 3), proposed: new Float64Array(runs.length * 3) }
  const runPassengerSaving = { accepted: new Float64Array(runs.length * 3), proposed: new Float64Array(runs.length * 3) }
  for (const sc of ['accepted', 'proposed'] as const) {
    const sav = saving[sc]
    const S = runSaving[sc]
    const X = runPassengerSaving[sc]
    runs.forEach((run, i) => {
      for (let a = 0; a < A; a++) {
        const p = run.periods[a]
        if (p < 0) continue
        const load = loads[run.route * P + p]
        for (let d = 0; d < 3; d++) {
          const s = sav[(a * P + p) * 3 + d]
          S[i * 3 + d] += s
          X[i * 3 + d] += s * load
        }
      }
    })
  }

  return {
    digest, rows, inputs, year, runs, share, annualDays,
    periodMinutes: digest.periods.map((p) => windowMinutes(p)),
    rowAt,
    figure: (a, p, d) => figs[(a * P + p) * 3 + d],
    saving, loads, runSaving, runPassengerSaving,
  }
}

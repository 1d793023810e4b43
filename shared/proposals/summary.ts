// From per-period figures to what a row and a corridor add up to on an average day of a type.
// A bus that runs the corridor passes every intersection, so savings per trip add along it.
import { DAY_TYPES } from '../signals/time-of-day'
import type { CorridorTotalsDto, PeriodResultDto, RowResultsSummary } from '../schemas/proposals'

const LOS_ORDER = ['A', 'B', 'C', 'D', 'E', 'F']
const worstLos = (grades: (string | null)[]) => grades.reduce<string | null>((w, g) => (g && (!w || LOS_ORDER.indexOf(g) > LOS_ORDER.indexOf(w)) ? g : w), null)
const maxOrNull = (xs: (number | null)[]) => {
  const v = xs.filter((x): x is number => x !== null)
  return v.length ? Math.max(...v) : null
}

export function summariseRow(periods: readonly PeriodResultDto[]): RowResultsSummary[] {
  const out: RowResultsSummary[] = []
  for (const dayType of DAY_TYPES) {
    const ok = periods.filter((p) => p.dayType === dayType && !p.error && p.savingPerTripS !== null)
    if (!ok.length) continue
    const trips = ok.reduce((s, p) => s + p.tripsPerDay, 0)
    const saving = trips > 0
      ? ok.reduce((s, p) => s + p.savingPerTripS! * p.tripsPerDay, 0) / trips
      : ok.reduce((s, p) => s + p.savingPerTripS!, 0) / ok.length
    out.push({
      dayType,
      tripsPerDay: trips,
      savingPerTripS: saving,
      dailyBusHoursSaved: ok.reduce((s, p) => s + (p.dailyBusHoursSaved ?? 0), 0),
      crossExtraDelayPerVehS: Math.max(...ok.map((p) => p.crossExtraDelayPerVehS ?? 0)),
      vcBeforeMax: maxOrNull(ok.map((p) => p.vcBefore)),
      vcAfterMax: maxOrNull(ok.map((p) => p.vcAfter)),
      losBeforeWorst: worstLos(ok.map((p) => p.losBefore)),
      losAfterWorst: worstLos(ok.map((p) => p.losAfter)),
      personDelayBalanceS: ok.reduce((s, p) => s + (p.personDelayBalanceS ?? 0), 0),
    })
  }
  return out
}

export function corridorTotals(rows: readonly { summaries: readonly RowResultsSummary[] }[]): CorridorTotalsDto[] {
  return DAY_TYPES.flatMap((dayType) => {
    const s = rows.map((r) => r.summaries.find((x) => x.dayType === dayType)).filter((x): x is RowResultsSummary => !!x)
    if (!s.length) return []
    return [{
      dayType,
      savingPerTripS: s.reduce((a, x) => a + x.savingPerTripS, 0),
      dailyBusHoursSaved: s.reduce((a, x) => a + x.dailyBusHoursSaved, 0),
      personDelayBalanceS: s.reduce((a, x) => a + x.personDelayBalanceS, 0),
      rowsEvaluated: s.length,
    }]
  })
}

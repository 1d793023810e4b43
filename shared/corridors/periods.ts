// Time periods of a corridor: the slices of the day that volumes, timing plans and results are
// given for. Times are "HH:MM"; a period whose end is before its start runs past midnight.
import { overlapMinutes, windowMinutes, type TimeWindow } from '../signals/time-of-day'

export interface PeriodDraft extends TimeWindow { name: string }

/** Practitioners' usual split of a weekday (common practice); every corridor starts with it. */
export const DEFAULT_PERIODS: readonly PeriodDraft[] = [
  { name: 'Early morning', startTime: '05:00', endTime: '07:00' },
  { name: 'AM peak', startTime: '07:00', endTime: '09:00' },
  { name: 'Midday', startTime: '09:00', endTime: '15:00' },
  { name: 'PM peak', startTime: '15:00', endTime: '18:00' },
  { name: 'Evening', startTime: '18:00', endTime: '22:00' },
  { name: 'Night', startTime: '22:00', endTime: '05:00' },
]

export interface PeriodIssue { path: (string | number)[]; message: string }

/** Names unique, windows not empty and not overlapping. Gaps are allowed (not evaluated). */
export function checkPeriods(periods: readonly PeriodDraft[]): PeriodIssue[] {
  const issues: PeriodIssue[] = []
  periods.forEach((p, i) => {
    if (windowMinutes(p) === 0) issues.push({ path: [i, 'endTime'], message: 'The period has no length; use 00:00 to 24:00 for the whole day.' })
    for (let j = 0; j < i; j++) {
      const q = periods[j]
      if (q.name.trim().toLowerCase() === p.name.trim().toLowerCase()) issues.push({ path: [i, 'name'], message: `Another period is already called "${q.name}".` })
      else if (overlapMinutes(p, q) > 0) issues.push({ path: [i, 'startTime'], message: `"${p.name}" (${p.startTime}-${p.endTime}) overlaps "${q.name}" (${q.startTime}-${q.endTime}).` })
    }
  })
  return issues
}

// Active dates of each service_id: the weekly pattern of calendar.txt between its start and end
// dates, then the exceptions of calendar_dates.txt (1 = service added, 2 = service removed).
// GTFS Schedule reference, calendar.txt and calendar_dates.txt.
import { weekdayIndex } from './date'

export interface CalendarRule {
  serviceId: string
  /** Monday first, as the columns of calendar.txt. */
  days: readonly boolean[]
  startDay: number
  endDay: number
}

export interface CalendarException {
  serviceId: string
  day: number
  exceptionType: 1 | 2
}

/** Sorted active day numbers of every service_id named in either file (possibly none). */
export function serviceDates(rules: readonly CalendarRule[], exceptions: readonly CalendarException[]): Map<string, number[]> {
  const active = new Map<string, Set<number>>()
  const setOf = (id: string) => {
    let s = active.get(id)
    if (!s) active.set(id, (s = new Set()))
    return s
  }
  for (const r of rules) {
    const s = setOf(r.serviceId)
    for (let d = r.startDay; d <= r.endDay; d++) if (r.days[weekdayIndex(d)]) s.add(d)
  }
  for (const e of exceptions) {
    const s = setOf(e.serviceId)
    if (e.exceptionType === 1) s.add(e.day)
    else s.delete(e.day)
  }
  const out = new Map<string, number[]>()
  for (const [id, s] of active) out.set(id, [...s].sort((a, b) => a - b))
  return out
}

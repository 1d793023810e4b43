// Day types of service days (day numbers since 1970-01-01, as shared/gtfs/date.ts).
import { weekdayIndex } from '../gtfs/date'
import type { DayType } from '../signals/time-of-day'

export function dayTypeOf(day: number): DayType {
  const w = weekdayIndex(day)
  return w === 5 ? 'saturday' : w === 6 ? 'sunday' : 'weekday'
}

export type PerDayType = Record<DayType, number>
export const zeroPerDayType = (): PerDayType => ({ weekday: 0, saturday: 0, sunday: 0 })

/** How many days of each type lie in [startDay, endDay]. */
export function daysOfType(startDay: number, endDay: number): PerDayType {
  const out = zeroPerDayType()
  for (let d = startDay; d <= endDay; d++) out[dayTypeOf(d)]++
  return out
}

/**
 * How often a service runs on an average day of each type within the range: the dates it runs
 * on divided by the days of that type in the range (1 = every such day, 0.2 = one weekday in five).
 */
export function serviceShare(serviceDays: readonly number[], range: PerDayType, startDay: number, endDay: number): PerDayType {
  const out = zeroPerDayType()
  for (const d of serviceDays) if (d >= startDay && d <= endDay) out[dayTypeOf(d)]++
  for (const k of Object.keys(out) as DayType[]) out[k] = range[k] ? out[k] / range[k] : 0
  return out
}

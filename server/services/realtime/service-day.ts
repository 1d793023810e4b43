// GTFS counts stop times from "noon minus 12 h" of the service day in the agency's time zone
// (GTFS Schedule reference, stop_times.arrival_time), which is midnight except on the days the
// clocks change. These helpers turn a service date and such a count into Unix seconds and back.
import { dayOfIso, gtfsDate, parseGtfsDate } from '../../../shared/gtfs/date'
import { dayTypeOf } from '../../../shared/corridors/day-types'
import type { DayType } from '../../../shared/signals/time-of-day'

const formatters = new Map<string, Intl.DateTimeFormat>()

function formatter(timeZone: string): Intl.DateTimeFormat {
  let f = formatters.get(timeZone)
  if (!f) {
    f = new Intl.DateTimeFormat('en-CA', {
      timeZone, hourCycle: 'h23', year: 'numeric', month: '2-digit', day: '2-digit', hour: '2-digit', minute: '2-digit', second: '2-digit',
    })
    formatters.set(timeZone, f)
  }
  return f
}

/** Local wall-clock parts of an instant in a time zone. */
export function localParts(unixS: number, timeZone: string) {
  const parts: Record<string, number> = {}
  for (const p of formatter(timeZone).formatToParts(new Date(unixS * 1000))) {
    if (p.type !== 'literal') parts[p.type] = Number(p.value)
  }
  return { year: parts.year, month: parts.month, day: parts.day, hour: parts.hour, minute: parts.minute, second: parts.second }
}

/** Seconds the zone is ahead of UTC at an instant. */
export function zoneOffsetS(unixS: number, timeZone: string): number {
  const p = localParts(unixS, timeZone)
  return Math.round(Date.UTC(p.year, p.month - 1, p.day, p.hour, p.minute, p.second) / 1000 - unixS)
}

/** "20240506" -> Unix seconds of local noon minus 12 h on that date. */
export function serviceDayStart(date: string, timeZone: string): number {
  if (!/^\d{8}$/.test(date)) throw new Error(`service date "${date}" is not YYYYMMDD`)
  const noonUtc = Date.UTC(Number(date.slice(0, 4)), Number(date.slice(4, 6)) - 1, Number(date.slice(6, 8)), 12) / 1000
  // Local noon: shift by the zone's offset, then take the offset again at that instant in case a
  // clock change lies between the two (no zone changes its clocks at noon itself).
  const guess = noonUtc - zoneOffsetS(noonUtc, timeZone)
  const noon = noonUtc - zoneOffsetS(guess, timeZone)
  return noon - 12 * 3600
}

/** The local calendar date of an instant, as YYYYMMDD. */
export function localDate(unixS: number, timeZone: string): string {
  const p = localParts(unixS, timeZone)
  return `${p.year}${String(p.month).padStart(2, '0')}${String(p.day).padStart(2, '0')}`
}

/** The service day `days` after a "YYYYMMDD" one. */
export function addDays(date: string, days: number): string {
  const day = parseGtfsDate(date)
  if (day === null) throw new Error(`service date "${date}" is not YYYYMMDD`)
  return gtfsDate(day + days)
}

/** Weekday, Saturday or Sunday of a "YYYY-MM-DD" service day. */
export const dayTypeOfIso = (iso: string): DayType => dayTypeOf(dayOfIso(iso))

// GTFS Schedule dates are "YYYYMMDD" service days. Inside Fanlight a service day is a whole
// number of days since 1970-01-01 (a "day number"), which makes ranges and weekdays arithmetic.

export const GTFS_DATE_PATTERN = /^\d{8}$/

const MS_PER_DAY = 86_400_000

/** Day number of a real calendar date "YYYYMMDD", or null (20190230 is refused). */
export function parseGtfsDate(text: string): number | null {
  if (!GTFS_DATE_PATTERN.test(text)) return null
  const y = Number(text.slice(0, 4)), m = Number(text.slice(4, 6)), d = Number(text.slice(6, 8))
  if (m < 1 || m > 12 || d < 1 || d > 31) return null
  const ms = Date.UTC(y, m - 1, d)
  const back = new Date(ms)
  if (back.getUTCFullYear() !== y || back.getUTCMonth() !== m - 1 || back.getUTCDate() !== d) return null
  return Math.round(ms / MS_PER_DAY)
}

/** "YYYY-MM-DD" of a day number (the form the API and the database use). */
export function isoDate(day: number): string {
  return new Date(day * MS_PER_DAY).toISOString().slice(0, 10)
}

/** "YYYYMMDD" of a day number. */
export function gtfsDate(day: number): string {
  return isoDate(day).replaceAll('-', '')
}

/** Day number of "YYYY-MM-DD". */
export function dayOfIso(iso: string): number {
  return Math.round(Date.parse(`${iso}T00:00:00Z`) / MS_PER_DAY)
}

/** 0 = Monday ... 6 = Sunday, the column order of calendar.txt. */
export function weekdayIndex(day: number): number {
  // 1970-01-01 was a Thursday (index 3).
  return (((day + 3) % 7) + 7) % 7
}

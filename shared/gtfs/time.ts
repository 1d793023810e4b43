// GTFS Schedule times: "H:MM:SS" or "HH:MM:SS" counted from "noon minus 12 h" of the service day,
// so trips that run past midnight carry hours of 24 and more ("25:35:00" is 01:35 the next day).

/** Hours may have one to three digits; minutes and seconds two digits below 60. */
export const GTFS_TIME_PATTERN = /^\d{1,3}:[0-5]\d:[0-5]\d$/

/**
 * Seconds since noon minus 12 h, or null when the text is not a GTFS time. Parsed by character
 * codes rather than a regular expression: it runs once per stop time, millions of times a feed.
 */
export function parseGtfsTime(text: string): number | null {
  const n = text.length
  if (n < 7 || n > 9) return null
  const c1 = n - 6 // index of the first colon
  if (text.charCodeAt(c1) !== 58 || text.charCodeAt(n - 3) !== 58) return null
  let hours = 0
  for (let i = 0; i < c1; i++) {
    const d = text.charCodeAt(i) - 48
    if (d < 0 || d > 9) return null
    hours = hours * 10 + d
  }
  const m1 = text.charCodeAt(c1 + 1) - 48, m2 = text.charCodeAt(c1 + 2) - 48
  const s1 = text.charCodeAt(n - 2) - 48, s2 = text.charCodeAt(n - 1) - 48
  if (m1 < 0 || m1 > 5 || m2 < 0 || m2 > 9 || s1 < 0 || s1 > 5 || s2 < 0 || s2 > 9) return null
  return hours * 3600 + (m1 * 10 + m2) * 60 + s1 * 10 + s2
}

/** Seconds since noon minus 12 h as "HH:MM:SS" (hours keep going past 24). */
export function formatGtfsTime(seconds: number): string {
  const s = Math.round(seconds)
  const h = Math.floor(s / 3600)
  const m = Math.floor((s % 3600) / 60)
  const sec = s % 60
  return `${String(h).padStart(2, '0')}:${String(m).padStart(2, '0')}:${String(sec).padStart(2, '0')}`
}

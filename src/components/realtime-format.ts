// How observed times are written on the Observed page and its panels.

/** 425 -> "7:05" (minutes and seconds). */
export function minSec(s: number | null | undefined): string {
  if (s === null || s === undefined || !Number.isFinite(s)) return '–'
  const sign = s < 0 ? '−' : ''
  const a = Math.round(Math.abs(s))
  return `${sign}${Math.floor(a / 60)}:${String(a % 60).padStart(2, '0')}`
}

/** A signed number of seconds: "−35 s", "+4.2 s". */
export function signedS(s: number | null | undefined, digits = 0): string {
  if (s === null || s === undefined || !Number.isFinite(s)) return '–'
  const v = Number(s.toFixed(digits))
  return `${v > 0 ? '+' : v < 0 ? '−' : ''}${Math.abs(v).toFixed(digits)} s`
}

export function percent(share: number | null | undefined): string {
  return share === null || share === undefined ? '–' : `${Math.round(share * 100)} %`
}

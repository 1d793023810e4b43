// How savings figures read on screen, in the report and in CSV headers: minutes and seconds,
// hours, shares and money. A missing figure is a dash.
const missing = (x: number | null | undefined): x is null | undefined => x === null || x === undefined || !Number.isFinite(x)
const nf = (digits: number) => new Intl.NumberFormat('en-GB', { minimumFractionDigits: digits, maximumFractionDigits: digits })

export const round = (x: number, digits: number) => Math.round(x * 10 ** digits) / 10 ** digits

export function number(x: number | null | undefined, digits = 0): string {
  return missing(x) ? '–' : nf(digits).format(x)
}

/** Seconds shown as minutes with two decimals ("1.25 min"). */
export function minutes(s: number | null | undefined, digits = 2): string {
  return missing(s) ? '–' : `${nf(digits).format(s / 60)} min`
}

export function percent(share: number | null | undefined, digits = 1): string {
  return missing(share) ? '–' : `${nf(digits).format(share * 100)}%`
}

export function hours(h: number | null | undefined, digits = 0): string {
  return missing(h) ? '–' : `${nf(digits).format(h)} h`
}

export function money(x: number | null | undefined, currency: string): string {
  if (missing(x)) return '–'
  try {
    return new Intl.NumberFormat('en-GB', { style: 'currency', currency, maximumFractionDigits: 0 }).format(x)
  } catch {
    return `${nf(0).format(x)} ${currency}`
  }
}

/** "5 → 4" for a before and after pair. */
export const beforeAfter = (a: number, b: number) => (a === b ? String(a) : `${a} → ${b}`)

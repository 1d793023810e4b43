// Order statistics and a percentile bootstrap for before/after run-time comparisons.
// Quantiles interpolate linearly between order statistics (Hyndman & Fan 1996, definition 7, the
// default of R and NumPy). The bootstrap resamples each period's trips with replacement and takes
// the 2.5th and 97.5th percentiles of the resampled change (Efron & Tibshirani 1993, the
// percentile interval). The generator is seeded so the same data always give the same interval.

export function quantile(sortedValues: ArrayLike<number>, p: number): number {
  const n = sortedValues.length
  if (n === 0) return NaN
  const h = (n - 1) * p
  const lo = Math.floor(h)
  const hi = Math.min(n - 1, lo + 1)
  return sortedValues[lo] + (h - lo) * (sortedValues[hi] - sortedValues[lo])
}

export const sortNumbers = (values: Iterable<number>) => Float64Array.from(values).sort()

export const median = (values: Iterable<number>) => quantile(sortNumbers(values), 0.5)
export const p85 = (values: Iterable<number>) => quantile(sortNumbers(values), 0.85)

/** mulberry32: a small, well-mixed 32-bit generator; enough for resampling, not for secrets. */
export function seededRandom(seed: number): () => number {
  let a = seed >>> 0
  return () => {
    a = (a + 0x6d2b79f5) >>> 0
    let t = a
    t = Math.imul(t ^ (t >>> 15), t | 1)
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61)
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296
  }
}

export interface BootstrapResult {
  /** The statistic of the after sample minus that of the before sample. */
  change: number
  low: number
  high: number
}

/**
 * Percentile-bootstrap interval of stat(after) - stat(before). Null when either sample is empty.
 */
export function bootstrapChange(
  before: number[],
  after: number[],
  p: number,
  opts: { resamples?: number; seed?: number; level?: number } = {},
): BootstrapResult | null {
  if (before.length === 0 || after.length === 0) return null
  const resamples = opts.resamples ?? 2000
  const level = opts.level ?? 0.95
  const rand = seededRandom(opts.seed ?? 1)
  const change = quantile(sortNumbers(after), p) - quantile(sortNumbers(before), p)
  const bufB = new Float64Array(before.length)
  const bufA = new Float64Array(after.length)
  const diffs = new Float64Array(resamples)
  for (let r = 0; r < resamples; r++) {
    for (let i = 0; i < before.length; i++) bufB[i] = before[Math.floor(rand() * before.length)]
    for (let i = 0; i < after.length; i++) bufA[i] = after[Math.floor(rand() * after.length)]
    diffs[r] = quantile(bufA.sort(), p) - quantile(bufB.sort(), p)
  }
  diffs.sort()
  const tail = (1 - level) / 2
  return { change, low: quantile(diffs, tail), high: quantile(diffs, 1 - tail) }
}

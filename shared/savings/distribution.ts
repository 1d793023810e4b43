// Discrete distributions of delay and run time on a grid of `binS` seconds, and the corridor
// run time as the sum of independent per-intersection delays: the distribution of a sum of
// independent variables is the convolution of their distributions. Independence means the
// arrival phase at one signal says nothing about the next (no progression); with coordinated
// signals the spread is smaller than this.

export interface Distribution {
  binS: number
  /** Value of p[0], in bins: p[k] is the probability of (offset + k) * binS seconds. */
  offset: number
  p: Float64Array
}

/** Mass below which the tails of a convolution are dropped (they cannot move a percentile). */
const TAIL = 1e-12

export function pointMass(valueS: number, binS = 1): Distribution {
  return { binS, offset: Math.round(valueS / binS), p: Float64Array.of(1) }
}

/** Each value rounded to the nearest bin, with its weight; weights are normalised. */
export function fromWeighted(values: ArrayLike<number>, weights: ArrayLike<number>, binS = 1): Distribution {
  if (values.length !== weights.length) throw new RangeError('values and weights differ in length')
  let lo = Infinity
  let hi = -Infinity
  let total = 0
  for (let i = 0; i < values.length; i++) {
    if (!(weights[i] > 0)) continue
    const b = Math.round(values[i] / binS)
    if (b < lo) lo = b
    if (b > hi) hi = b
    total += weights[i]
  }
  if (!(total > 0)) throw new RangeError('a distribution needs some positive weight')
  const p = new Float64Array(hi - lo + 1)
  for (let i = 0; i < values.length; i++) if (weights[i] > 0) p[Math.round(values[i] / binS) - lo] += weights[i] / total
  return { binS, offset: lo, p }
}

/** The distribution of X + Y for independent X and Y on the same grid. */
export function convolve(a: Distribution, b: Distribution): Distribution {
  if (a.binS !== b.binS) throw new RangeError('distributions on different grids')
  // Loop over the shorter one's non-zero bins: per-signal delays are sparse.
  const [long, short] = a.p.length >= b.p.length ? [a, b] : [b, a]
  const out = new Float64Array(long.p.length + short.p.length - 1)
  const L = long.p
  for (let k = 0; k < short.p.length; k++) {
    const w = short.p[k]
    if (w === 0) continue
    for (let j = 0; j < L.length; j++) out[j + k] += L[j] * w
  }
  let lo = 0
  let hi = out.length - 1
  while (lo < hi && out[lo] < TAIL) lo++
  while (hi > lo && out[hi] < TAIL) hi--
  return { binS: a.binS, offset: long.offset + short.offset + lo, p: out.slice(lo, hi + 1) }
}

export function convolveAll(ds: readonly Distribution[], binS = 1): Distribution {
  return ds.reduce((acc, d) => convolve(acc, d), pointMass(0, binS))
}

/** X + s, s rounded to the grid. */
export function shift(d: Distribution, s: number): Distribution {
  return { ...d, offset: d.offset + Math.round(s / d.binS) }
}

export function mean(d: Distribution): number {
  let m = 0
  let total = 0
  for (let k = 0; k < d.p.length; k++) { m += (d.offset + k) * d.p[k]; total += d.p[k] }
  return (m / total) * d.binS
}

/**
 * The q-quantile as the inverse of the cumulative distribution: the smallest value whose
 * cumulative probability reaches q (the rule of shared/model/stats.ts).
 */
export function percentile(d: Distribution, q: number): number {
  let total = 0
  for (let k = 0; k < d.p.length; k++) total += d.p[k]
  const target = q * total - 1e-9
  let cum = 0
  for (let k = 0; k < d.p.length; k++) {
    cum += d.p[k]
    if (cum >= target && d.p[k] > 0) return (d.offset + k) * d.binS
  }
  return (d.offset + d.p.length - 1) * d.binS
}

/**
 * One signal's bus delay over uniform arrival phases, from the model's delay-by-phase table:
 * without priority every phase weighs the same; with priority a bus that asks and is not
 * locked out (share `priorityWeight`) has the priority delay of its phase, the others the
 * baseline delay (the mixture the model's own mean and percentiles use).
 */
export function phaseDistributions(
  phases: readonly { baselineS: number; priorityS: number }[], priorityWeight: number, binS = 1,
): { without: Distribution; with: Distribution } {
  const n = phases.length
  const w = Math.min(1, Math.max(0, priorityWeight))
  const base = phases.map((x) => x.baselineS)
  const without = fromWeighted(base, new Array(n).fill(1), binS)
  const values = [...phases.map((x) => x.priorityS), ...base]
  const weights = [...new Array(n).fill(w), ...new Array(n).fill(1 - w)]
  return { without, with: fromWeighted(values, weights, binS) }
}

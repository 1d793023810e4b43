// Weighted summaries of bus delay over arrival phases (uniform arrivals, mixed scenarios).

export interface DelaySummary {
  mean: number
  median: number
  p90: number
}

/**
 * Mean and inverse-CDF quantiles (the smallest value whose cumulative weight reaches q) of the
 * mixture: each value of `a` weighs wA, each of `b` weighs wB. Sorted natively and merged, since
 * this runs twice per approach evaluation.
 */
export function mixtureSummary(a: ArrayLike<number>, wA: number, b: ArrayLike<number>, wB: number): DelaySummary {
  const sa = Float64Array.from(a).sort()
  const sb = Float64Array.from(b).sort()
  const total = wA * sa.length + wB * sb.length
  if (total <= 0) return { mean: 0, median: 0, p90: 0 }
  let sum = 0
  for (let i = 0; i < sa.length; i++) sum += wA * sa[i]
  for (let i = 0; i < sb.length; i++) sum += wB * sb[i]
  const quantile = (q: number): number => {
    const target = q * total * (1 - 1e-12)
    let cum = 0
    let i = 0
    let j = 0
    let last = 0
    while (i < sa.length || j < sb.length) {
      const takeA = j >= sb.length || (i < sa.length && sa[i] <= sb[j])
      if (takeA) { last = sa[i++]; cum += wA } else { last = sb[j++]; cum += wB }
      if (cum >= target && (takeA ? wA : wB) > 0) return last
    }
    return last
  }
  return { mean: sum / total, median: quantile(0.5), p90: quantile(0.9) }
}

export function summary(values: ArrayLike<number>): DelaySummary {
  return mixtureSummary(values, 1, [], 0)
}

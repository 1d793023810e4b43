// Weighted summaries of bus delay over arrival phases (uniform arrivals, mixed scenarios).

export interface DelaySummary {
  mean: number
  median: number
  p90: number
}

/** Mean and inverse-CDF quantiles (smallest value whose cumulative weight reaches q). */
export function weightedSummary(values: ArrayLike<number>, weights: ArrayLike<number>): DelaySummary {
  const n = values.length
  const order = Array.from({ length: n }, (_, i) => i).sort((a, b) => values[a] - values[b])
  let total = 0
  let sum = 0
  for (let i = 0; i < n; i++) {
    total += weights[i]
    sum += weights[i] * values[i]
  }
  if (total <= 0) return { mean: 0, median: 0, p90: 0 }
  const quantile = (q: number): number => {
    let cum = 0
    for (const i of order) {
      cum += weights[i]
      if (cum >= q * total - 1e-9 * total) return values[i]
    }
    return values[order[n - 1]]
  }
  return { mean: sum / total, median: quantile(0.5), p90: quantile(0.9) }
}

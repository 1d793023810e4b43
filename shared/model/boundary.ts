/**
 * Boundary conditions of a signalised approach.
 *
 * Signal: the stop line is an interior boundary, closed (zero flux) in red and open in green,
 * where it passes the Godunov flux (at most the capacity). Red comes first in each cycle:
 * cycle j is red on [jC, jC + C - g) and green on [jC + C - g, (j + 1) C).
 * Priority changes a plan locally: a green extension moves the start of the next red later,
 * an early green moves the end of a red earlier.
 *
 * Inflow: the arrival flow is the demand of the upstream ghost state; when the queue reaches the
 * upstream end the first cell's supply caps it and the rest waits outside (a vertical queue).
 */

/** Red intervals of the bus phase, sorted and disjoint; green in between. Times in s. */
export interface SignalPlan {
  redStart: Float64Array
  redEnd: Float64Array
  /** what a priority change did, as a key (plans with equal keys from one base are equal) */
  change?: string
}

export interface SignalInterval {
  startS: number
  endS: number
  state: 'red' | 'green'
}

export function fixedTimePlan(cycleS: number, effectiveGreenS: number, firstCycle: number, lastCycle: number): SignalPlan {
  const n = lastCycle - firstCycle + 1
  const redStart = new Float64Array(n)
  const redEnd = new Float64Array(n)
  const red = cycleS - effectiveGreenS
  for (let i = 0; i < n; i++) {
    redStart[i] = (firstCycle + i) * cycleS
    redEnd[i] = redStart[i] + red
  }
  return { redStart, redEnd }
}

/** Index of the first red that ends after t (the red containing t, or the next one); n if none. */
export function redIndexAfter(plan: SignalPlan, t: number): number {
  const ends = plan.redEnd
  let lo = 0
  let hi = ends.length
  while (lo < hi) {
    const mid = (lo + hi) >> 1
    if (ends[mid] > t) hi = mid
    else lo = mid + 1
  }
  return lo
}

export function isGreen(plan: SignalPlan, t: number): boolean {
  const i = redIndexAfter(plan, t)
  return i === plan.redEnd.length || t < plan.redStart[i]
}

/** Share of [t0, t1) that is green. */
export function openShare(plan: SignalPlan, t0: number, t1: number): number {
  let red = 0
  for (let i = redIndexAfter(plan, t0); i < plan.redEnd.length && plan.redStart[i] < t1; i++) {
    red += Math.min(t1, plan.redEnd[i]) - Math.max(t0, plan.redStart[i])
  }
  return 1 - red / (t1 - t0)
}

/** Open share of each step [t0 + n dt, t0 + (n + 1) dt), for the Godunov loop. */
export function openShares(plan: SignalPlan, t0: number, dt: number, steps: number): Float64Array {
  const out = new Float64Array(steps)
  for (let n = 0; n < steps; n++) out[n] = openShare(plan, t0 + n * dt, t0 + (n + 1) * dt)
  return out
}

export function signalIntervals(plan: SignalPlan, t0: number, t1: number): SignalInterval[] {
  const out: SignalInterval[] = []
  let t = t0
  for (let i = redIndexAfter(plan, t0); i < plan.redEnd.length && t < t1; i++) {
    const rs = Math.max(t, plan.redStart[i])
    if (rs >= t1) break
    if (rs > t) out.push({ startS: t, endS: rs, state: 'green' })
    const re = Math.min(t1, plan.redEnd[i])
    out.push({ startS: rs, endS: re, state: 'red' })
    t = re
  }
  if (t < t1) out.push({ startS: t, endS: t1, state: 'green' })
  return out
}

/** The plan with the green before red i held e seconds longer (the red starts e later). */
export function extendGreen(plan: SignalPlan, redIndex: number, e: number): SignalPlan {
  const redStart = plan.redStart.slice()
  redStart[redIndex] = Math.min(plan.redEnd[redIndex], redStart[redIndex] + e)
  return { redStart, redEnd: plan.redEnd, change: `${plan.change ?? ''}s${redIndex}:${redStart[redIndex]}` }
}

/** The plan with red i ended at newEnd (an early green). */
export function truncateRed(plan: SignalPlan, redIndex: number, newEnd: number): SignalPlan {
  const redEnd = plan.redEnd.slice()
  redEnd[redIndex] = Math.max(plan.redStart[redIndex], newEnd)
  return { redStart: plan.redStart, redEnd, change: `${plan.change ?? ''}e${redIndex}:${redEnd[redIndex]}` }
}

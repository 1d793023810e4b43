/**
 * Exact solution of the LWR model with a triangular diagram at a signalised stop line, by
 * Newell's (1993) cumulative counts.
 *
 * Let A(t) = q_a t count the vehicles that would pass the stop line by time t running free, and
 * D(t) those that do: a point queue discharging at the capacity s while a queue stands in green,
 * at q_a in green without a queue, and not at all in red. The count at distance d upstream is
 *
 *   N(d, t) = min{ A(t + d/vf), D(t - d/w) + kj d }.
 *
 * Two consequences carry the whole model:
 *  - every vehicle's delay equals its point-queue delay, D^-1(n) - A^-1(n);
 *  - the stopped queue of red i, [r0, r1), is the polygon in (d, t)
 *        t >= r0 + d/w          (the stopping wave from the line),
 *        t >= t*_i + d/u        (the back of the queue, a shock at u = q_a / (kj - k_a)),
 *        t <  r1 + d/w          (the discharge wave),
 *    with t*_i = A^-1(D(r0)) (= r0 when no queue is left from before), so its farthest point is
 *    d_max = (r1 - t*_i) / (1/u - 1/w), reached at r1 + d_max / w.
 * Inside the polygon vehicles stand at kj; elsewhere they run at vf (free or at capacity).
 * Valid while the back of the queue stays inside the modelled approach.
 */
import type { TriangularDiagram } from './fundamental-diagram'
import { capacity, freeDensity } from './fundamental-diagram'
import type { SignalPlan } from './boundary'

export interface ExactApproach {
  /** arrival flow, veh/s */
  qa: number
  /** saturation flow (capacity of the section), veh/s */
  s: number
  kj: number
  w: number
  vf: number
  /** arrival density, veh/m */
  ka: number
  /** speed of the back of the queue during red, m/s (positive, upstream) */
  u: number
}

/** Arrivals below this (veh/s) are treated as none, to keep the queue-back shock finite. */
const MIN_FLOW = 1e-9

export function exactApproach(d: TriangularDiagram, arrivalFlow: number): ExactApproach {
  const qa = Math.max(MIN_FLOW, arrivalFlow)
  const ka = freeDensity(d, qa)
  return { qa, s: capacity(d), kj: d.kj, w: d.w, vf: d.vf, ka, u: qa / (d.kj - ka) }
}

/** The point queue through a plan: queue at each red start and the t* of each red's polygon. */
export interface QueueField {
  plan: SignalPlan
  queueAtRedStart: Float64Array
  tStar: Float64Array
}

export function queueField(ex: ExactApproach, plan: SignalPlan, queueAtFirstRed = 0): QueueField {
  const { redStart, redEnd } = plan
  const n = redStart.length
  const queueAtRedStart = new Float64Array(n)
  const tStar = new Float64Array(n)
  let q = queueAtFirstRed
  for (let i = 0; i < n; i++) {
    queueAtRedStart[i] = q
    tStar[i] = redStart[i] - q / ex.qa
    if (i + 1 < n) {
      const atGreen = q + ex.qa * (redEnd[i] - redStart[i])
      q = Math.max(0, atGreen - (ex.s - ex.qa) * (redStart[i + 1] - redEnd[i]))
    }
  }
  return { plan, queueAtRedStart, tStar }
}

export interface RedQueue {
  /** farthest back of the stopped queue, m from the stop line */
  maxQueueM: number
  /** vehicles held by that length at jam density (all lanes) */
  maxQueueVeh: number
  /** when the back of the queue is farthest, s from the start of the red */
  maxQueueTimeS: number
  /** when the last queued vehicle passes the line, s after the start of green; null if it does not in this green */
  clearAfterGreenS: number | null
  /** queue left at the end of the following green, veh */
  residualVeh: number
}

export function redQueue(ex: ExactApproach, field: QueueField, i: number): RedQueue {
  const { redStart, redEnd } = field.plan
  const r0 = redStart[i]
  const r1 = redEnd[i]
  const dMax = ex.qa <= MIN_FLOW ? 0 : (r1 - field.tStar[i]) / (1 / ex.u - 1 / ex.w)
  const atGreen = field.queueAtRedStart[i] + ex.qa * (r1 - r0)
  const green = i + 1 < redStart.length ? redStart[i + 1] - r1 : Infinity
  const clear = atGreen / (ex.s - ex.qa)
  const cleared = ex.s > ex.qa && clear <= green
  return {
    maxQueueM: dMax,
    maxQueueVeh: dMax * ex.kj,
    maxQueueTimeS: r1 + dMax / ex.w - r0,
    clearAfterGreenS: cleared ? clear : null,
    residualVeh: cleared ? 0 : atGreen - (ex.s - ex.qa) * green,
  }
}

/**
 * Back of the stopped queue of red i at time t, m from the line (0 when none stands): the farthest
 * d inside the polygon, min(u (t - t*), w (t - r0)), while the discharge wave w (t - r1) has not
 * passed it.
 */
export function queueBackM(ex: ExactApproach, field: QueueField, i: number, t: number): number {
  const r0 = field.plan.redStart[i]
  const r1 = field.plan.redEnd[i]
  if (t < r0) return 0
  const back = Math.min(ex.u * (t - field.tStar[i]), ex.w * (t - r0))
  const front = Math.max(0, ex.w * (t - r1))
  return back > front ? back : 0
}

export interface RedGreen {
  /** vehicle-seconds of queue over the red and the green */
  area: number
  queueAtGreen: number
  queueAtEnd: number
  /** s after the start of green when the queue clears, or -1 */
  clearAfterGreen: number
}

/** Point queue through one red then one green: arrivals q, discharge s, queue q0 at the start. */
export function redGreen(q: number, s: number, q0: number, red: number, green: number): RedGreen {
  const atGreen = q0 + q * red
  let area = red * (q0 + 0.5 * q * red)
  const net = s - q
  if (net > 0 && atGreen <= net * green) {
    const clear = atGreen / net
    area += 0.5 * atGreen * clear
    return { area, queueAtGreen: atGreen, queueAtEnd: 0, clearAfterGreen: clear }
  }
  area += green * (atGreen - 0.5 * net * green)
  return { area, queueAtGreen: atGreen, queueAtEnd: atGreen - net * green, clearAfterGreen: -1 }
}

export interface PeriodDelay {
  /** mean delay of the vehicles arriving in the period, s */
  meanDelayS: number
  /** cycles evaluated (the period rounded up to whole cycles) */
  cycles: number
  /** queue left at the end of the period, veh */
  residualVeh: number
  /** the worst red of the period */
  worst: RedGreen
}

/**
 * Mean delay of vehicles arriving at a fixed-time signal over whole cycles from an empty queue.
 * Undersaturated signals repeat every cycle, so one cycle is exact; otherwise the period is run
 * cycle by cycle and the queue left at its end is served (FIFO: later arrivals do not delay it).
 */
export function periodDelay(q: number, s: number, cycleS: number, greenS: number, periodS: number): PeriodDelay {
  const red = cycleS - greenS
  const first = redGreen(q, s, 0, red, greenS)
  if (first.queueAtEnd === 0 || q <= 0) {
    return { meanDelayS: q > 0 ? first.area / (q * cycleS) : 0, cycles: 1, residualVeh: 0, worst: first }
  }
  const cycles = Math.max(1, Math.ceil(periodS / cycleS - 1e-9))
  let area = 0
  let queue = 0
  let worst = first
  for (let j = 0; j < cycles; j++) {
    const rg = redGreen(q, s, queue, red, greenS)
    area += rg.area
    queue = rg.queueAtEnd
    worst = rg
  }
  const residualVeh = queue
  // serve what is left with no further arrivals counted
  for (let guard = 0; queue > 0 && guard < 100_000; guard++) {
    const rg = redGreen(0, s, queue, red, greenS)
    area += rg.area
    queue = rg.queueAtEnd
  }
  return { meanDelayS: area / (q * cycles * cycleS), cycles, residualVeh, worst }
}

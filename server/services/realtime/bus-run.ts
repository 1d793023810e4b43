// A simulated bus run along a trip's shape for the demo realtime feed: cruise between stops,
// dwell at each stop, and wait at red signals behind a short queue. Early buses are not held at
// timepoints, so what signals cost shows in the run time. With priority on, a bus that
// arrives just after the end of green gets a green extension and a bus that finds red gets an
// early green, each within its limit. The numbers are plausible, not calibrated: the demo only
// needs buses whose delays look like a signalised street and shrink where priority runs.

export interface RunStop {
  distM: number
  stopId: string
  stopSequence: number
  /** Scheduled departure, Unix seconds (only the first stop's is used: the run starts then). */
  departureS: number
}

/** The timing in force at an instant: cycle, bus-street green, and a Unix time at which a green starts. */
export interface SignalTiming {
  cycleS: number
  greenS: number
  greenStartS: number
}

export interface RunSignal {
  distM: number
  /** Null where no plan runs (the signal rests in green for the bus street). */
  timingAt: (unixS: number) => SignalTiming | null
  priority: boolean
}

export interface PriorityRules {
  enabled: boolean
  maxExtensionS: number
  maxEarlyGreenS: number
}

/** A corner of the run: at time t the bus is at d; `stop` is set while it dwells at that stop index. */
export interface Knot {
  t: number
  d: number
  stop: number | null
}

/** Metres a queued car takes up, and seconds each one ahead adds at discharge (common practice). */
const CAR_SPACING_M = 7.5
const DISCHARGE_HEADWAY_S = 2
const START_UP_LOST_S = 2
const ACCEL_MPS2 = 1.2

export function simulateRun(stops: RunStop[], signals: RunSignal[], rand: () => number, priority: PriorityRules): Knot[] {
  const v = 8.5 + 2 * rand() // 31-38 km/h between stops: a 50 km/h street in peak traffic
  const lost = v / (2 * ACCEL_MPS2) // half the time lost to one stop
  const knots: Knot[] = []
  let t = stops[0].departureS - 20 + 140 * rand() // leaves the first stop up to 20 s early or 2 min late
  let d = stops[0].distM
  knots.push({ t: t - 25, d, stop: 0 }, { t, d, stop: 0 })
  const last = stops[stops.length - 1].distM
  const events = [
    ...stops.slice(1, -1).map((s, i) => ({ kind: 'stop' as const, distM: s.distM, index: i + 1 })),
    ...signals.filter((g) => g.distM > d && g.distM < last).map((g) => ({ kind: 'signal' as const, distM: g.distM, signal: g })),
  ].sort((a, b) => a.distM - b.distM || (a.kind === 'stop' ? -1 : 1))
  const moveTo = (x: number) => {
    t += (x - d) / v
    d = x
    knots.push({ t, d, stop: null })
  }
  for (const e of events) {
    if (e.kind === 'stop') {
      moveTo(e.distM)
      t += lost
      knots.push({ t, d, stop: e.index })
      t += 20 + 20 * rand() + (rand() < 0.1 ? 20 : 0) // boarding and alighting at peak; now and then a crowd
      knots.push({ t, d, stop: e.index })
      t += lost
      knots.push({ t, d, stop: null })
      continue
    }
    const g = e.signal
    const queue = Math.floor(rand() * 5)
    const queueTail = Math.max(d, g.distM - queue * CAR_SPACING_M)
    const atLine = t + (g.distM - d) / v
    const timing = g.timingAt(atLine)
    if (!timing) { moveTo(g.distM); continue }
    const phase = (((atLine - timing.greenStartS) % timing.cycleS) + timing.cycleS) % timing.cycleS
    let redLeft = phase < timing.greenS ? 0 : timing.cycleS - phase
    if (redLeft > 0 && priority.enabled && g.priority) {
      if (phase - timing.greenS <= priority.maxExtensionS) redLeft = 0 // green held for the bus
      else redLeft = Math.max(0, redLeft - priority.maxEarlyGreenS) // red ended early
    }
    if (redLeft === 0) { moveTo(g.distM); continue }
    moveTo(queueTail)
    const greenAt = atLine + redLeft
    const starts = greenAt + START_UP_LOST_S + queue * DISCHARGE_HEADWAY_S * 0.75
    if (starts > t) { t = starts; knots.push({ t, d, stop: null }) }
    t += lost
    moveTo(g.distM)
  }
  moveTo(last)
  t += lost
  knots.push({ t, d, stop: stops.length - 1 }, { t: t + 20, d, stop: stops.length - 1 })
  return knots
}

/** Where the run is at time T, or null before its start and after its end. */
export function positionAt(knots: Knot[], T: number): { distM: number; stop: number | null } | null {
  if (knots.length === 0 || T < knots[0].t || T > knots[knots.length - 1].t) return null
  let k = 0
  while (k < knots.length - 2 && knots[k + 1].t <= T) k++
  const a = knots[k], b = knots[k + 1]
  if (a.stop !== null && a.stop === b.stop) return { distM: a.d, stop: a.stop }
  const u = b.t > a.t ? (T - a.t) / (b.t - a.t) : 1
  return { distM: a.d + u * (b.d - a.d), stop: null }
}

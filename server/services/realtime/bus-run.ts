// A simulated bus run along a trip's shape for the demo realtime feed: cruise between stops,
// dwell at each stop, and wait at red signals behind a short queue. With priority on, a bus that
// arrives just after the end of green gets a green extension and a bus that finds red gets an
// early green, each within its limit. The numbers are plausible, not calibrated: the demo only
// needs buses whose delays look like a signalised street and shrink where priority runs.

export interface RunStop {
  distM: number
  stopId: string
  stopSequence: number
  /** Scheduled departure, Unix seconds. */
  departureS: number
}

export interface RunSignal {
  distM: number
  cycleS: number
  greenS: number
  /** Start of the bus-street green after midnight UTC, s (the corridor's common reference). */
  offsetS: number
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
  const v = 8.5 + 3.5 * rand() // 31-43 km/h between stops
  const lost = v / (2 * ACCEL_MPS2) // half the time lost to one stop
  const knots: Knot[] = []
  let t = stops[0].departureS - 40 + 70 * rand() // leaves the first stop up to 40 s early or 30 s late
  let d = stops[0].distM
  knots.push({ t: t - 25, d, stop: 0 }, { t, d, stop: 0 })
  const last = stops[stops.length - 1].distM
  const events = [
    ...stops.slice(1).map((s, i) => ({ kind: 'stop' as const, distM: s.distM, index: i + 1 })),
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
      t += 8 + 22 * rand() + (rand() < 0.1 ? 25 : 0) // boarding and alighting; now and then a crowd
      knots.push({ t, d, stop: e.index })
      t += lost
      knots.push({ t, d, stop: null })
      continue
    }
    const g = e.signal
    const queue = Math.floor(rand() * 5)
    const queueTail = Math.max(d, g.distM - queue * CAR_SPACING_M)
    const atLine = t + (g.distM - d) / v
    const phase = (((atLine - g.offsetS) % g.cycleS) + g.cycleS) % g.cycleS
    let redLeft = phase < g.greenS ? 0 : g.cycleS - phase
    if (redLeft > 0 && priority.enabled && g.priority) {
      if (phase - g.greenS <= priority.maxExtensionS) redLeft = 0 // green held for the bus
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

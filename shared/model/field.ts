/**
 * The Godunov field of one signalised approach, for any concave diagram: cells from the
 * upstream end (-lengthM) to the downstream end (+downstreamLengthM), the stop line on a cell
 * interface, arrivals as the upstream demand (with a vertical queue outside when the first cell
 * cannot take them), a free exit downstream, the signal on the stop-line interface.
 * t = 0 is the start of the first red, with the arrival state everywhere at t = 0.
 *
 * A stored field keeps every step's densities (Float32, enough for charts and bus paths); a
 * cursor reads stored rows and, for a changed plan or past the end, steps on live from a row.
 */
import { type Diagram, capacity, freeDensity, speed } from './fundamental-diagram'
import { newStepFlows, stableDt, step, type StepBoundary } from './godunov'
import { type SignalPlan, isGreen, openShare, redIndexAfter } from './boundary'
import { type BusRun, type BusSetup, isFullStop, queueStopPenaltyS, requestAtDoorClose } from './bus'
import { kmhToMps } from './si'

export interface ApproachGrid {
  /** upstream end, m (negative) */
  x0: number
  dx: number
  n: number
  /** interface index of the stop line */
  stopInterface: number
}

export function approachGrid(lengthM: number, downstreamLengthM: number, dxM: number): ApproachGrid {
  const nUp = Math.max(2, Math.round(lengthM / dxM))
  const dx = lengthM / nUp
  const nDown = Math.max(1, Math.ceil(downstreamLengthM / dx - 1e-9))
  return { x0: -lengthM, dx, n: nUp + nDown, stopInterface: nUp }
}

export function cellCentres(grid: ApproachGrid): number[] {
  return Array.from({ length: grid.n }, (_, i) => grid.x0 + (i + 0.5) * grid.dx)
}

export interface StoredField {
  diagram: Diagram
  grid: ApproachGrid
  plan: SignalPlan
  arrivalFlow: number
  dt: number
  steps: number
  /** (steps + 1) rows of n densities, veh/m */
  density: Float32Array
  /** flow through the stop line during each step, veh/s */
  stopFlow: Float64Array
  /** vehicles waiting outside the upstream end at each step */
  waiting: Float64Array
}

/** Slower than this counts as queued or stopped (5 km/h). */
export const QUEUED_SPEED = kmhToMps(5)

export function fieldDt(d: Diagram, grid: ApproachGrid, cfl = 0.9): number {
  return stableDt(d, grid.dx, cfl)
}

function boundaryFor(d: Diagram, grid: ApproachGrid, arrivalFlow: number, waiting: number, dt: number): StepBoundary {
  return {
    inflowDemand: Math.min(capacity(d), arrivalFlow + waiting / dt),
    outflowSupply: capacity(d),
    signalInterface: grid.stopInterface,
    signalOpen: 1,
  }
}

export function simulateField(d: Diagram, grid: ApproachGrid, plan: SignalPlan, arrivalFlow: number, horizonS: number, cfl = 0.9): StoredField {
  const dt = fieldDt(d, grid, cfl)
  const steps = Math.ceil(horizonS / dt)
  const n = grid.n
  const density = new Float32Array((steps + 1) * n)
  const stopFlow = new Float64Array(steps)
  const waiting = new Float64Array(steps + 1)
  const k = new Float64Array(n).fill(freeDensity(d, arrivalFlow))
  density.set(k, 0)
  const flows = newStepFlows()
  let queue = 0
  for (let m = 0; m < steps; m++) {
    const bc = boundaryFor(d, grid, arrivalFlow, queue, dt)
    bc.signalOpen = openShare(plan, m * dt, (m + 1) * dt)
    step(d, k, dt, grid.dx, bc, flows)
    queue = Math.max(0, queue + (arrivalFlow - flows.inflow) * dt)
    stopFlow[m] = flows.signal
    waiting[m + 1] = queue
    density.set(k, (m + 1) * n)
  }
  return { diagram: d, grid, plan, arrivalFlow, dt, steps, density, stopFlow, waiting }
}

/** Rows of a field under a plan: stored rows before fromStep, live steps after. */
export class FieldCursor {
  private readonly live: Float64Array
  private liveStep: number
  private queue: number
  private readonly flows = newStepFlows()

  constructor(private readonly base: StoredField, private readonly plan: SignalPlan, private readonly fromStep: number) {
    const m0 = Math.min(fromStep, base.steps)
    const n = base.grid.n
    this.live = Float64Array.from(base.density.subarray(m0 * n, (m0 + 1) * n))
    this.liveStep = m0
    this.queue = base.waiting[m0]
  }

  get dt(): number {
    return this.base.dt
  }

  /** Row m; rows past fromStep must be asked for in increasing order. */
  row(m: number): ArrayLike<number> {
    const n = this.base.grid.n
    if (m < this.liveStep && m <= this.base.steps && m < this.fromStep) return this.base.density.subarray(m * n, (m + 1) * n)
    const { diagram: d, grid, arrivalFlow, dt } = this.base
    while (this.liveStep < m) {
      const bc = boundaryFor(d, grid, arrivalFlow, this.queue, dt)
      bc.signalOpen = openShare(this.plan, this.liveStep * dt, (this.liveStep + 1) * dt)
      step(d, this.live, dt, grid.dx, bc, this.flows)
      this.queue = Math.max(0, this.queue + (arrivalFlow - this.flows.inflow) * dt)
      this.liveStep++
    }
    return this.live
  }
}

/** First time at which two plans differ (Infinity if they do not). */
export function firstDifference(a: SignalPlan, b: SignalPlan): number {
  let t = Infinity
  for (let i = 0; i < a.redStart.length; i++) {
    if (a.redStart[i] !== b.redStart[i]) t = Math.min(t, a.redStart[i], b.redStart[i])
    if (a.redEnd[i] !== b.redEnd[i]) t = Math.min(t, a.redEnd[i], b.redEnd[i])
  }
  return t
}

export function cursorFor(base: StoredField, plan: SignalPlan): FieldCursor {
  if (plan === base.plan) return new FieldCursor(base, plan, base.steps)
  const t = firstDifference(base.plan, plan)
  return new FieldCursor(base, plan, Number.isFinite(t) ? Math.max(0, Math.floor(t / base.dt)) : base.steps)
}

const EVENT_EPS = 1e-9

/**
 * The bus through a Godunov field: speed from the cell it is in (piecewise constant in space and
 * over each step, integrated exactly across cell edges), capped by its own speed; the stop line
 * is a wall in red. Below QUEUED_SPEED it counts as standing; when it moves off, a stand that
 * began in motion costs the queue-stop penalty of bus.ts for the time it stood.
 */
export function runBusField(cursor: FieldCursor, base: StoredField, plan: SignalPlan, bus: BusSetup, startS: number, record: boolean): BusRun {
  const d = base.diagram
  const { x0, dx, n } = base.grid
  const dt = cursor.dt
  const doorClose = requestAtDoorClose(bus)
  // events along the way, in order of position
  const events: { x: number; kind: 'check-in' | 'near' | 'line' | 'far' | 'exit' }[] = []
  if (!doorClose) events.push({ x: -bus.checkInDistanceM, kind: 'check-in' })
  if (bus.nearSide) events.push({ x: -bus.nearSide.distanceM, kind: 'near' })
  events.push({ x: 0, kind: 'line' })
  if (bus.farSide) events.push({ x: bus.farSide.distanceM, kind: 'far' })
  events.push({ x: bus.downstreamLengthM, kind: 'exit' })
  events.sort((a, b) => a.x - b.x)

  const points = record ? [startS, -bus.lengthM] : null
  let x = -bus.lengthM
  let t = startS
  let ev = 0
  let requestS = NaN
  let crossS = NaN
  let holdUntil = -Infinity
  let stopped = false
  let counted = false
  let afterDwell = false
  let standSince = 0
  let stops = 0
  let held = false
  let lastPoint = t
  let m = Math.max(0, Math.floor(t / dt))
  const guardSteps = m + Math.ceil(3600 / dt)

  while (ev < events.length && m < guardSteps) {
    const row = cursor.row(m)
    const tEnd = (m + 1) * dt
    while (t < tEnd - EVENT_EPS && ev < events.length) {
      if (holdUntil > t) {
        t = Math.min(holdUntil, tEnd)
        if (points && t === holdUntil) points.push(t, x)
        continue
      }
      const event = events[ev]
      if (x >= event.x - EVENT_EPS) {
        x = event.x
        if (event.kind === 'check-in') {
          requestS = t
        } else if (event.kind === 'near') {
          holdUntil = t + bus.nearSide!.dwellS + bus.stopPenaltyS
          if (doorClose) requestS = holdUntil
          if (points) points.push(t, x)
          afterDwell = true
          stopped = false
          counted = false
        } else if (event.kind === 'line') {
          if (!isGreen(plan, t)) {
            if (!stopped) {
              stopped = true
              held = true
              standSince = t
              counted = !afterDwell
            }
            const i = redIndexAfter(plan, t)
            holdUntil = plan.redEnd[i]
            if (points) points.push(t, x)
            continue
          }
          crossS = t
        } else if (event.kind === 'far') {
          holdUntil = t + bus.farSide!.dwellS + bus.stopPenaltyS
          if (points) points.push(t, x)
          afterDwell = true
          stopped = false
          counted = false
        } else {
          if (points) points.push(t, x)
        }
        ev++
        continue
      }
      const cell = Math.min(n - 1, Math.max(0, Math.floor((x - x0) / dx + EVENT_EPS)))
      const v = Math.min(bus.speed, speed(d, row[cell]))
      if (v < QUEUED_SPEED) {
        if (!stopped) {
          stopped = true
          held = true
          standSince = t
          counted = !afterDwell
          if (points) points.push(t, x)
        }
      } else {
        afterDwell = false
        if (stopped) {
          stopped = false
          if (points) points.push(t, x)
          if (counted) {
            counted = false
            const wait = t - standSince
            if (isFullStop(bus, wait)) stops++
            holdUntil = t + queueStopPenaltyS(bus, wait)
            continue
          }
        }
      }
      if (v <= 0) { t = tEnd; continue }
      const cellEdge = x0 + (cell + 1) * dx
      const target = Math.min(cellEdge, event.x)
      const tau = Math.min(tEnd - t, (target - x) / v)
      x += v * tau
      t += tau
      if (Math.abs(x - cellEdge) < EVENT_EPS) x = cellEdge
    }
    if (t >= tEnd - EVENT_EPS) {
      t = Math.max(t, tEnd)
      m++
      // the path curves through fans: keep a point every half second for charts
      if (points && t - lastPoint >= 0.5 && ev < events.length) { points.push(t, x); lastPoint = t }
    }
  }
  if (points && stopped) points.push(t, x)
  return { startS, requestS, crossS, exitS: t, stops, held, points }
}

/**
 * The time-space diagram of one approach: the Godunov density field over whole cycles (t = 0 at
 * the start of the first red, the arrival state everywhere at t = 0), the signal at the stop
 * line, and one bus through it without and with priority.
 */
import type { ApproachInput, ApproachResult, TimeSpaceResult } from '../schemas/model'
import { signalIntervals, fixedTimePlan, type SignalPlan } from './boundary'
import { freeRunS, freeTimeToLineS } from './bus'
import { type BusModel, decidePriority } from './priority'
import { type StoredField, approachGrid, cellCentres, cursorFor, runBusField, simulateField } from './field'
import { prepareApproach } from './setup'
import { evaluateApproach } from './approach'

/** Rows kept for the chart at most (the field is sampled in time to this). */
const MAX_ROWS = 600

export interface TimeSpaceOptions {
  /** whole cycles shown (default 2) */
  cycles?: number
  /** cell size, m (default 5) */
  dxM?: number
  /** the bus drawn; default: the arrival phase where priority saves most */
  busArrivalPhaseS?: number
  /** the approach's evaluation, when already at hand (it picks the default phase) */
  evaluation?: ApproachResult
}

/** Options come from the time-space body's fields, or from `options`, which wins. */
export function timeSpace(input: ApproachInput & TimeSpaceOptions, options: TimeSpaceOptions = {}): TimeSpaceResult {
  const cycles = options.cycles ?? input.cycles ?? 2
  const dxM = options.dxM ?? input.dxM ?? 5
  const p = prepareApproach(input)
  const C = p.cycleS
  const windowS = cycles * C
  const phase = options.busArrivalPhaseS ?? input.busArrivalPhaseS ?? defaultPhase(options.evaluation ?? evaluateApproach(input))
  const tLine = freeTimeToLineS(p.bus)
  // the bus in the second cycle when there is one, and never before t = 0
  let virtualArrival = phase + (cycles >= 2 ? C : 0)
  while (virtualArrival - tLine < 0) virtualArrival += C
  const start = virtualArrival - tLine
  const horizon = Math.max(windowS, start + freeRunS(p.bus) + 3 * C)
  const grid = approachGrid(input.approach.lengthM, input.approach.downstreamLengthM, dxM)
  const plan = fixedTimePlan(C, p.greenS, 0, Math.ceil(horizon / C) + 2)
  const field = simulateField(p.diagram, grid, plan, p.qa, horizon)
  const model: BusModel = { run: (pl, record) => runBusField(cursorFor(field, pl), field, pl, p.bus, start, record) }
  const base = model.run(plan, true)
  const outcome = decidePriority(model, plan, p.limits, base, true)
  const granted = outcome.action !== 'none'
  const priorityField = granted ? simulateField(p.diagram, grid, outcome.plan, p.qa, horizon) : null
  const rows = sampleRows(field, windowS)
  return {
    xM: cellCentres(grid).map(round2),
    tS: rows.map((m) => round2(m * field.dt)),
    densityVehPerKm: densityRows(field, rows),
    jamDensityVehPerKm: p.diagram.kj * 1000,
    signal: intervals(plan, windowS),
    priorityDensityVehPerKm: priorityField ? densityRows(priorityField, rows) : null,
    prioritySignal: intervals(outcome.plan, windowS),
    bus: {
      arrivalPhaseS: phase,
      action: outcome.action,
      greenTakenS: outcome.greenTakenS,
      baseline: trajectory(base.points, windowS),
      priority: trajectory(outcome.run.points, windowS),
    },
  }
}

function defaultPhase(result: ApproachResult): number {
  let best = result.delayByArrivalPhase[0]
  const saving = (r: typeof best) => r.baselineS - r.priorityS
  for (const r of result.delayByArrivalPhase) {
    if (saving(r) > saving(best) + 1e-9 || (saving(best) <= 1e-9 && r.baselineS > best.baselineS)) best = r
  }
  return best?.phaseS ?? 0
}

function sampleRows(field: StoredField, windowS: number): number[] {
  const last = Math.min(field.steps, Math.round(windowS / field.dt))
  const every = Math.max(1, Math.ceil(last / MAX_ROWS))
  const out: number[] = []
  for (let m = 0; m <= last; m += every) out.push(m)
  if (out[out.length - 1] !== last) out.push(last)
  return out
}

function densityRows(field: StoredField, rows: number[]): number[][] {
  const n = field.grid.n
  return rows.map((m) => Array.from(field.density.subarray(m * n, (m + 1) * n), (k) => Math.round(k * 10_000) / 10))
}

function intervals(plan: SignalPlan, windowS: number) {
  return signalIntervals(plan, 0, windowS)
}

function trajectory(points: number[] | null, windowS: number): { tS: number; xM: number }[] {
  const out: { tS: number; xM: number }[] = []
  if (!points) return out
  for (let i = 0; i < points.length; i += 2) {
    const t = points[i]
    const x = points[i + 1]
    if (t <= windowS) { out.push({ tS: round2(t), xM: round2(x) }); continue }
    if (i >= 2 && points[i - 2] < windowS) {
      const t0 = points[i - 2]
      const x0 = points[i - 1]
      out.push({ tS: round2(windowS), xM: round2(x0 + ((x - x0) * (windowS - t0)) / (t - t0)) })
    }
    break
  }
  return out
}

const round2 = (x: number): number => Math.round(x * 100) / 100

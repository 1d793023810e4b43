/**
 * One signalised approach with a bus: the traffic figures, the bus delay by arrival phase with
 * and without priority, and what the grants cost the cross street and give the cars.
 *
 * Solvers: with the triangular diagram the exact cumulative-count solution (fast enough for every
 * trip of a corridor); with any other diagram, or when asked, the Godunov field. Both follow the
 * same bus and priority rules (bus.ts, priority.ts), which is what lets each check the other.
 *
 * Arrival phase: when the bus would reach the stop line running free (its near-side dwell
 * included), in s from the start of red. Uniform arrivals over the cycle give the mean, median
 * and 90th percentile. Undersaturated approaches repeat every cycle, so one cycle of phases is
 * exact; oversaturated ones are run over the analysis period from an empty queue.
 */
import type { ApproachInput, ApproachResult, LosGrade, PhaseDelay, PriorityAction } from '../schemas/model'
import { freeDensity, speed } from './fundamental-diagram'
import { type SignalPlan, fixedTimePlan } from './boundary'
import { type BusRun, type BusSetup, freeRunS, freeTimeToLineS, runBusExact } from './bus'
import { type ExactApproach, type QueueField, exactApproach, periodDelay, queueField, redQueue } from './cumulative-counts'
import { type BusModel, askingShare, decidePriority } from './priority'
import { type GrantEffect, busApproachChanges, crossStreetChanges, grantEffect } from './cross-street'
import { controlDelayS, levelOfService } from './hcm'
import { mixtureSummary, summary } from './stats'
import { prepareApproach, type PreparedApproach } from './setup'
import { QUEUED_SPEED, type StoredField, approachGrid, cursorFor, runBusField, simulateField } from './field'
import { perSToPerHour } from './si'

export interface EvaluateOptions {
  /** 'auto': exact for the triangular diagram, Godunov otherwise */
  solver?: 'auto' | 'exact' | 'godunov'
  /** arrival-phase resolution, s (default 1) */
  phaseStepS?: number
  /** Godunov cell size, m (default 4) */
  dxM?: number
}

/** Traffic figures of the car stream on the bus approach. */
export interface TrafficFigures {
  maxQueueM: number
  maxQueueTimeS: number
  queueClearS: number | null
  meanDelayS: number
  residualQueueVeh: number
}

/** The bus at one arrival phase (and, oversaturated, in one cycle). */
export interface BusSample {
  phaseIndex: number
  baselineS: number
  priorityS: number
  baselineHeld: boolean
  priorityHeld: boolean
  action: PriorityAction
  greenTakenS: number
}

/** Which cycles of a plan the buses arrive in, and the plan that covers them. */
interface Window {
  plan: SignalPlan
  busCycles: number[]
  /** queue at the plan's first red */
  firstQueue: number
}

export function evaluateApproach(input: ApproachInput, options: EvaluateOptions = {}): ApproachResult {
  const p = prepareApproach(input)
  const solver = options.solver ?? 'auto'
  const exact = solver === 'exact' || (solver === 'auto' && p.diagram.kind === 'triangular')
  if (exact && p.diagram.kind !== 'triangular') throw new RangeError('the exact solver needs the triangular diagram')
  const step = options.phaseStepS ?? 1
  const phases = phaseGrid(p.cycleS, step)
  const { traffic, samples } = exact ? runExact(p, phases) : runGodunov(p, phases, options.dxM ?? 4)
  return summarise(p, phases, traffic, samples, exact ? 'exact-triangular' : 'godunov')
}

export function phaseGrid(cycleS: number, stepS: number): number[] {
  const n = Math.max(1, Math.round(cycleS / stepS))
  return Array.from({ length: n }, (_, i) => (i * cycleS) / n)
}

function oversaturated(p: PreparedApproach): boolean {
  return p.qa * p.cycleS >= p.s * p.greenS
}

function busWindow(p: PreparedApproach): Window {
  const C = p.cycleS
  const tLine = freeTimeToLineS(p.bus)
  if (!oversaturated(p)) {
    const first = -(Math.ceil(tLine / C) + 1)
    const last = 3 + Math.ceil(((p.bus.nearSide?.dwellS ?? 0) + p.bus.stopPenaltyS) / C)
    return { plan: fixedTimePlan(C, p.greenS, first, last), busCycles: [0], firstQueue: 0 }
  }
  const pd = periodDelay(p.qa, p.s, C, p.greenS, p.periodS)
  const extra = Math.ceil(pd.residualVeh / (p.s * p.greenS)) + 3
  return {
    plan: fixedTimePlan(C, p.greenS, 0, pd.cycles + extra),
    busCycles: Array.from({ length: pd.cycles }, (_, j) => j),
    firstQueue: 0,
  }
}

function exactTraffic(p: PreparedApproach, ex: ExactApproach): TrafficFigures {
  const pd = periodDelay(p.qa, p.s, p.cycleS, p.greenS, p.periodS)
  const plan = fixedTimePlan(p.cycleS, p.greenS, 0, pd.cycles)
  const worst = redQueue(ex, queueField(ex, plan), pd.cycles - 1)
  return {
    maxQueueM: worst.maxQueueM,
    maxQueueTimeS: worst.maxQueueTimeS,
    queueClearS: worst.clearAfterGreenS,
    meanDelayS: pd.meanDelayS,
    residualQueueVeh: pd.residualVeh,
  }
}

function runExact(p: PreparedApproach, phases: number[]): { traffic: TrafficFigures; samples: BusSample[] } {
  if (p.diagram.kind !== 'triangular') throw new RangeError('the exact solver needs the triangular diagram')
  const ex = exactApproach(p.diagram, p.qa)
  const win = busWindow(p)
  const tLine = freeTimeToLineS(p.bus)
  const free = freeRunS(p.bus)
  const model = new ExactBusModel(ex, win, p.bus)
  const samples: BusSample[] = []
  for (const cycle of win.busCycles) {
    for (let k = 0; k < phases.length; k++) {
      model.start = cycle * p.cycleS + phases[k] - tLine
      samples.push(sampleOf(model, win.plan, p, k, model.start, free))
    }
  }
  return { traffic: exactTraffic(p, ex), samples }
}

/** One bus at a time through the exact field; fields of changed plans are kept, phases share them. */
class ExactBusModel implements BusModel {
  start = 0
  private readonly baseField: QueueField
  private readonly changed = new Map<string, QueueField>()

  constructor(private readonly ex: ExactApproach, private readonly win: Window, private readonly bus: BusSetup) {
    this.baseField = queueField(ex, win.plan, win.firstQueue)
  }

  run(plan: SignalPlan, record: boolean): BusRun {
    return runBusExact(this.ex, this.fieldOf(plan), this.bus, this.start, record)
  }

  private fieldOf(plan: SignalPlan): QueueField {
    if (plan === this.win.plan) return this.baseField
    const key = plan.change
    if (key === undefined) return queueField(this.ex, plan, this.win.firstQueue)
    let field = this.changed.get(key)
    if (!field) {
      field = queueField(this.ex, plan, this.win.firstQueue)
      this.changed.set(key, field)
    }
    return field
  }
}

function sampleOf(model: BusModel, plan: SignalPlan, p: PreparedApproach, phaseIndex: number, start: number, free: number): BusSample {
  const base = model.run(plan, false)
  const outcome = decidePriority(model, plan, p.limits, base)
  return {
    phaseIndex,
    baselineS: base.exitS - start - free,
    priorityS: outcome.run.exitS - start - free,
    baselineHeld: base.held,
    priorityHeld: outcome.run.held,
    action: outcome.action,
    greenTakenS: outcome.greenTakenS,
  }
}

/** Godunov: one warm-up cycle, then the buses; oversaturated, a few cycles across the period. */
function runGodunov(p: PreparedApproach, phases: number[], dxM: number): { traffic: TrafficFigures; samples: BusSample[] } {
  const C = p.cycleS
  const tLine = freeTimeToLineS(p.bus)
  const free = freeRunS(p.bus)
  const grid = approachGrid(p.bus.lengthM, p.bus.downstreamLengthM, dxM)
  const over = oversaturated(p)
  const pd = periodDelay(p.qa, p.s, C, p.greenS, p.periodS)
  const lead = Math.ceil(tLine / C)
  const busCycles = over
    ? [...new Set([lead, Math.floor((lead + pd.cycles - 1) / 2), pd.cycles - 1].map((c) => Math.max(lead, Math.min(c, pd.cycles - 1))))]
    : [1 + lead]
  const measured: [number, number] = over ? [0, pd.cycles] : [1, 2]
  const lastBus = Math.max(...busCycles)
  const tail = over ? Math.ceil(pd.residualVeh / (p.s * p.greenS)) + 2 : 2
  const horizon = (Math.max(lastBus, measured[1]) + tail + 1) * C + free
  const plan = fixedTimePlan(C, p.greenS, 0, Math.ceil(horizon / C) + 2)
  const field = simulateField(p.diagram, grid, plan, p.qa, horizon)
  const samples: BusSample[] = []
  for (const cycle of busCycles) {
    for (let k = 0; k < phases.length; k++) {
      const start = cycle * C + phases[k] - tLine
      const model: BusModel = { run: (pl, record) => runBusField(cursorFor(field, pl), field, pl, p.bus, start, record) }
      samples.push(sampleOf(model, plan, p, k, start, free))
    }
  }
  const traffic = fieldTraffic(p, field, measured[0], measured[1])
  traffic.residualQueueVeh = over ? pd.residualVeh : 0
  return { traffic, samples }
}

/** Queue, clearance and delay read off a stored field over whole cycles [c0, c1). */
export function fieldTraffic(p: PreparedApproach, field: StoredField, c0: number, c1: number): TrafficFigures {
  const { grid, dt, density, waiting, stopFlow } = field
  const d = field.diagram
  const n = grid.n
  const C = p.cycleS
  const mA = Math.round((c0 * C) / dt)
  const mB = Math.min(field.steps, Math.round((c1 * C) / dt))
  let vehTime = 0
  let maxQueueM = 0
  let maxQueueTimeS = 0
  for (let m = mA; m < mB; m++) {
    let inside = waiting[m]
    const row = m * n
    for (let i = 0; i < n; i++) inside += density[row + i] * grid.dx
    vehTime += inside * dt
    let back = 0
    if (waiting[m] > 0) back = p.bus.lengthM + waiting[m] / d.kj
    else {
      for (let i = 0; i < grid.stopInterface; i++) {
        if (speed(d, density[row + i]) < QUEUED_SPEED) { back = -(grid.x0 + (i + 0.5) * grid.dx); break }
      }
    }
    if (back > maxQueueM) {
      maxQueueM = back
      maxQueueTimeS = m * dt - Math.floor((m * dt) / C + 1e-9) * C
    }
  }
  const freeTime = (p.bus.lengthM + p.bus.downstreamLengthM) / speed(d, freeDensity(d, p.qa))
  const meanDelayS = Math.max(0, vehTime / (p.qa * (mB - mA) * dt) - freeTime)
  // the queue has cleared when the stop-line flow falls from capacity towards the arrivals
  const lastCycle = c1 - 1
  const greenStart = lastCycle * C + p.redS
  const threshold = 0.5 * (p.s + p.qa)
  let queueClearS: number | null = null
  for (let m = Math.ceil(greenStart / dt) + 1; m < Math.min(field.steps, Math.round((c1 * C) / dt)); m++) {
    if (stopFlow[m] < threshold) { queueClearS = m * dt - greenStart; break }
  }
  return { maxQueueM, maxQueueTimeS, queueClearS, meanDelayS, residualQueueVeh: 0 }
}

function summarise(p: PreparedApproach, phases: number[], traffic: TrafficFigures, samples: BusSample[], solver: ApproachResult['solver']): ApproachResult {
  const input = p.input
  const n = samples.length
  const C = p.cycleS
  const warnings = [...p.warnings]

  // share of phases granted to an asking, unlocked bus, then lockout and lateness
  let grantedCount = 0
  for (const s of samples) if (s.action !== 'none') grantedCount++
  const share = askingShare({
    grantShareWhenAsked: n ? grantedCount / n : 0,
    lateOnly: input.priority.lateOnly,
    lateShare: input.priority.lateShare,
    busesPerHour: input.bus.busesPerHour,
    cycleS: C,
    lockoutCycles: input.priority.lockoutCycles,
  })
  const wP = share.askShare * (1 - share.lockedOutShare)

  const base = new Float64Array(n)
  const prio = new Float64Array(n)
  let baseHeld = 0
  let prioHeld = 0
  for (let i = 0; i < n; i++) {
    const s = samples[i]
    base[i] = s.baselineS
    prio[i] = s.priorityS
    if (s.baselineHeld) baseHeld++
    prioHeld += wP * (s.priorityHeld ? 1 : 0) + (1 - wP) * (s.baselineHeld ? 1 : 0)
  }
  const b = summary(base)
  // asking, unlocked buses get the priority run; the others the baseline
  const pr = mixtureSummary(prio, wP, base, 1 - wP)

  // per grant: green taken, cross-street extra delay, bus-approach car delay change
  const cr = p.cross
  const maxCycles = Math.max(4, Math.ceil(p.periodS / C))
  let taken = 0
  let crossExtra = 0
  let crossQueue = 0
  let recovery = 0
  let mainChange = 0
  // many phases take the same green (the full limit): work each distinct grant out once
  const effects = new Map<string, [GrantEffect, GrantEffect]>()
  for (const s of samples) {
    if (s.action === 'none') continue
    taken += s.greenTakenS
    const key = s.action + s.greenTakenS
    let e = effects.get(key)
    if (!e) {
      e = [
        grantEffect(cr.q, cr.s, cr.redS, cr.greenS, crossStreetChanges(s.action, s.greenTakenS), maxCycles),
        grantEffect(p.qa, p.s, p.redS, p.greenS, busApproachChanges(s.action, s.greenTakenS), maxCycles),
      ]
      effects.set(key, e)
    }
    crossExtra += e[0].extraVehS
    crossQueue += e[0].extraQueueVeh
    recovery = Math.max(recovery, e[0].recoveryCycles)
    mainChange += e[1].extraVehS
  }
  const g = grantedCount || 1
  const perGrant = { taken: taken / g, crossExtra: crossExtra / g, crossQueue: crossQueue / g, mainChange: mainChange / g }
  const grantsPerHour = input.bus.busesPerHour * share.grantShare
  const crossPerHour = perSToPerHour(cr.q)
  const extraDelayPerVehS = crossPerHour > 0 ? (grantsPerHour * perGrant.crossExtra) / crossPerHour : 0
  const takenPerCycle = (grantsPerHour * perGrant.taken * C) / 3600
  const crossCapacity = (sGreen: number) => (perSToPerHour(cr.s) * sGreen) / C
  const vcBefore = cr.greenS > 0 ? crossPerHour / crossCapacity(cr.greenS) : Infinity
  const greenAfter = Math.max(1e-9, cr.greenS - takenPerCycle)
  const vcAfter = crossPerHour / crossCapacity(greenAfter)
  const periodH = input.approach.analysisPeriodMin / 60
  const delayBeforeS = crossPerHour > 0
    ? controlDelayS({ cycleS: C, greenS: cr.greenS, arrivalVehPerHour: crossPerHour, saturationVehPerHour: perSToPerHour(cr.s), periodH })
    : 0
  const delayAfterS = delayBeforeS + extraDelayPerVehS

  const X = (p.qa * C) / (p.s * p.greenS)
  const hcmDelayS = controlDelayS({ cycleS: C, greenS: p.greenS, arrivalVehPerHour: perSToPerHour(p.qa), saturationVehPerHour: perSToPerHour(p.s), periodH })

  const meanSavingS = b.mean - pr.mean
  const occupancy = input.crossStreet.carOccupancy
  const busPassengersSavedS = input.bus.busesPerHour * input.bus.passengers * meanSavingS
  const mainStreetOccupantsSavedS = -grantsPerHour * perGrant.mainChange * occupancy
  const crossStreetOccupantsLostS = grantsPerHour * perGrant.crossExtra * occupancy

  if (traffic.maxQueueM > input.approach.lengthM) {
    warnings.push(`The queue reaches ${traffic.maxQueueM.toFixed(0)} m, beyond the ${input.approach.lengthM} m modelled: lengthen the approach; delays here are understated.`)
  }
  if (X >= 1) warnings.push(`The approach is oversaturated (degree of saturation ${X.toFixed(2)}): figures cover the ${input.approach.analysisPeriodMin}-minute analysis period.`)
  if (vcAfter > 1 && vcBefore <= 1) warnings.push(`With the grants the cross street runs over capacity (v/c ${vcAfter.toFixed(2)}).`)

  return {
    solver,
    traffic: {
      capacityVehPerHour: perSToPerHour((p.s * p.greenS) / C),
      degreeOfSaturation: X,
      maxQueueM: traffic.maxQueueM,
      maxQueueVeh: traffic.maxQueueM * p.diagram.kj,
      maxQueueTimeS: traffic.maxQueueTimeS,
      queueClearS: traffic.queueClearS,
      meanDelayS: traffic.meanDelayS,
      hcmDelayS,
      los: levelOfService(hcmDelayS, X),
      residualQueueVeh: traffic.residualQueueVeh,
    },
    bus: {
      freeRunS: freeRunS(p.bus),
      baseline: { meanDelayS: b.mean, medianDelayS: b.median, p90DelayS: b.p90, stoppedShare: n ? baseHeld / n : 0 },
      priority: {
        meanDelayS: pr.mean,
        medianDelayS: pr.median,
        p90DelayS: pr.p90,
        stoppedShare: n ? prioHeld / n : 0,
        grantShare: share.grantShare,
        lockedOutShare: share.lockedOutShare,
      },
      meanSavingS,
    },
    crossStreet: {
      effectiveGreenS: cr.greenS,
      availableGreenS: cr.availableS,
      greenTakenPerGrantS: grantedCount ? perGrant.taken : 0,
      grantsPerHour,
      extraDelayPerGrantVehS: grantedCount ? perGrant.crossExtra : 0,
      extraQueuePerGrantVeh: grantedCount ? perGrant.crossQueue : 0,
      recoveryCycles: recovery,
      extraDelayPerVehS,
      delayBeforeS,
      delayAfterS,
      vcBefore,
      vcAfter,
      losBefore: levelOfService(delayBeforeS, vcBefore),
      losAfter: levelOfService(delayAfterS, vcAfter) as LosGrade,
    },
    mainStreet: { delayChangePerGrantVehS: grantedCount ? perGrant.mainChange : 0 },
    personDelay: { busPassengersSavedS, mainStreetOccupantsSavedS, crossStreetOccupantsLostS },
    personDelayBalanceS: busPassengersSavedS + mainStreetOccupantsSavedS - crossStreetOccupantsLostS,
    delayByArrivalPhase: phaseTable(phases, samples),
    warnings,
  }
}

/** One row per phase; oversaturated samples of several cycles are averaged. */
function phaseTable(phases: number[], samples: BusSample[]): PhaseDelay[] {
  const rows = phases.map((phaseS) => ({ phaseS, baselineS: 0, priorityS: 0, granted: 0, taken: 0, count: 0, ext: 0, early: 0 }))
  for (const s of samples) {
    const r = rows[s.phaseIndex]
    r.baselineS += s.baselineS
    r.priorityS += s.priorityS
    r.count++
    if (s.action !== 'none') { r.granted++; r.taken += s.greenTakenS }
    if (s.action === 'green-extension') r.ext++
    if (s.action === 'early-green') r.early++
  }
  return rows.map((r) => {
    const c = r.count || 1
    const granted = r.granted * 2 >= r.count && r.granted > 0
    const action: PriorityAction = !granted ? 'none' : r.ext >= r.early ? 'green-extension' : 'early-green'
    return { phaseS: r.phaseS, baselineS: r.baselineS / c, priorityS: r.priorityS / c, granted, action, greenTakenS: r.granted ? r.taken / r.granted : 0 }
  })
}


/** Many approaches at once (a corridor's intersections, periods and scenarios). */
export function evaluateApproaches(inputs: readonly ApproachInput[], options: EvaluateOptions = {}): ApproachResult[] {
  return inputs.map((input) => evaluateApproach(input, options))
}

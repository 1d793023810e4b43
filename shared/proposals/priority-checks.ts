// Checks of a row's priority limits against the timing plans of its intersection. Both green
// extension and early green are paid for by the cross street: an extension holds the bus phase and
// delays the cross-street green, an early green ends the cross-street green sooner. What can be
// taken in one cycle is the cross-street green above the larger of its minimum green and, where
// pedestrians crossing the bus street walk with it, walk + clearance. Without lockout both kinds
// can hit the same cross-street green (an extension at its start, an early green at its end).
import type { RowSettings } from '../schemas/proposals'
import { crossGreenS, type TimingValues } from '../signals/timing-plan'
import { SOURCES } from '../signals/limits'
import { usesEarlyGreen, usesExtension } from './settings'

export interface PriorityCheck {
  path: (string | number)[]
  message: string
  severity: 'error' | 'warning'
  source: string
  planName: string | null
}

export type PlanForCheck = Pick<TimingValues, 'cycleS' | 'busGreenS' | 'yellowS' | 'redClearanceS' | 'crossMinGreenS' | 'pedWalkS' | 'pedClearanceS' | 'pedConcurrent'> & { name: string }

/** Usual upper end of a green extension or early green, about 10-15 s (common practice). */
export const USUAL_MAX_PRIORITY_S = 15

const EPS = 1e-9
const s = (x: number) => `${Number(x.toFixed(1))} s`

/** Cross-street green that priority may take in one cycle of the plan (may be negative). */
export function spareCrossGreenS(p: PlanForCheck): number {
  const floor = Math.max(p.crossMinGreenS, p.pedConcurrent ? p.pedWalkS + p.pedClearanceS : 0)
  return crossGreenS(p) - floor
}

/** The most that one cycle may lose to priority with these settings. */
export function takenPerCycleS(st: RowSettings): number {
  const e = usesExtension(st) ? st.maxExtensionS : 0
  const a = usesEarlyGreen(st) ? st.maxEarlyGreenS : 0
  return st.lockoutCycles === 0 ? e + a : Math.max(e, a)
}

export function checkPriority(st: RowSettings, plans: readonly PlanForCheck[]): PriorityCheck[] {
  const out: PriorityCheck[] = []
  const ext = usesExtension(st)
  const early = usesEarlyGreen(st)
  if (st.strategy === 'none') return out
  if (!plans.length) {
    out.push({ path: ['strategy'], message: 'This intersection has no timing plan yet, so the limits cannot be checked or evaluated.', severity: 'warning', source: SOURCES.commonPractice, planName: null })
    return out
  }
  for (const p of plans) {
    const spare = spareCrossGreenS(p)
    const floorName = p.pedConcurrent && p.pedWalkS + p.pedClearanceS > p.crossMinGreenS ? 'walk + pedestrian clearance' : 'minimum green'
    const source = floorName === 'minimum green' ? SOURCES.minGreen : SOURCES.pedestrian
    if (spare <= EPS) {
      out.push({ path: ['strategy'], message: `Plan "${p.name}" leaves no cross-street green above its ${floorName}: no priority can be granted without breaking it.`, severity: 'error', source, planName: p.name })
      continue
    }
    if (ext && st.maxExtensionS > spare + EPS) {
      out.push({ path: ['maxExtensionS'], message: `Plan "${p.name}" can give at most ${s(spare)} before the cross street falls below its ${floorName}; an extension of ${s(st.maxExtensionS)} is too long.`, severity: 'error', source, planName: p.name })
    }
    if (early && st.maxEarlyGreenS > spare + EPS) {
      out.push({ path: ['maxEarlyGreenS'], message: `Plan "${p.name}" can give at most ${s(spare)} before the cross street falls below its ${floorName}; an early green of ${s(st.maxEarlyGreenS)} is too long.`, severity: 'error', source, planName: p.name })
    }
    if (ext && early && st.lockoutCycles === 0 && st.maxExtensionS <= spare + EPS && st.maxEarlyGreenS <= spare + EPS
      && st.maxExtensionS + st.maxEarlyGreenS > spare + EPS) {
      out.push({ path: ['lockoutCycles'], message: `Without lockout one cross-street green of plan "${p.name}" may lose both the extension and the early green (${s(st.maxExtensionS + st.maxEarlyGreenS)}), more than the ${s(spare)} it can give; set a lockout of at least 1 cycle or lower the limits.`, severity: 'error', source, planName: p.name })
    }
  }
  if (ext && st.maxExtensionS > USUAL_MAX_PRIORITY_S) {
    out.push({ path: ['maxExtensionS'], message: `Extensions are usually kept to 10-15 s; ${s(st.maxExtensionS)} is long.`, severity: 'warning', source: SOURCES.commonPractice, planName: null })
  }
  if (early && st.maxEarlyGreenS > USUAL_MAX_PRIORITY_S) {
    out.push({ path: ['maxEarlyGreenS'], message: `Early greens are usually kept to 10-15 s; ${s(st.maxEarlyGreenS)} is long.`, severity: 'warning', source: SOURCES.commonPractice, planName: null })
  }
  if (ext && st.maxExtensionS === 0) out.push({ path: ['maxExtensionS'], message: 'The strategy extends the green but the extension limit is 0 s.', severity: 'warning', source: SOURCES.commonPractice, planName: null })
  if (early && st.maxEarlyGreenS === 0) out.push({ path: ['maxEarlyGreenS'], message: 'The strategy starts the green early but the early-green limit is 0 s.', severity: 'warning', source: SOURCES.commonPractice, planName: null })
  if (st.lockoutCycles === 0) {
    out.push({ path: ['lockoutCycles'], message: 'Without lockout the cross street may lose green cycle after cycle; 1-2 cycles is usual.', severity: 'warning', source: SOURCES.commonPractice, planName: null })
  }
  return out
}

/**
 * The settings with their limits lowered, where needed, to what every plan can spare (whole
 * seconds); no priority where a plan has nothing to spare. Never raises a limit.
 */
export function fitToPlans(st: RowSettings, plans: readonly PlanForCheck[]): RowSettings {
  if (st.strategy === 'none' || !plans.length) return st
  const spare = Math.floor(Math.min(...plans.map(spareCrossGreenS)) + 1e-9)
  if (spare < 1) return { ...st, strategy: 'none' }
  const both = usesExtension(st) && usesEarlyGreen(st) && st.lockoutCycles === 0
  let e = Math.min(st.maxExtensionS, spare)
  let a = Math.min(st.maxEarlyGreenS, spare)
  if (both && e + a > spare) {
    // Without lockout both come out of one cross-street green: share what it can give.
    e = Math.min(e, Math.ceil(spare / 2))
    a = Math.min(a, spare - e)
  }
  return { ...st, maxExtensionS: usesExtension(st) ? e : st.maxExtensionS, maxEarlyGreenS: usesEarlyGreen(st) ? a : st.maxEarlyGreenS }
}

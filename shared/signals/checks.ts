// Timing checks shared by the server (errors refuse a save with 422) and the client (shown live
// while a plan is edited). Each issue names the field it is about and the source of the rule.

import {
  CYCLE_USUAL_MAX_S, CYCLE_USUAL_MIN_S, MIN_GREEN_LOWEST_S, PED_CLEARANCE_SPEED_M_PER_S, PED_TOTAL_SPEED_M_PER_S,
  PED_WALK_DEFAULT_MIN_S, RED_CLEARANCE_MAX_S, SOURCES, YELLOW_MAX_S, YELLOW_MIN_S,
} from './limits'
import { crossGreenS, intergreenS, type PlanWindow, type TimingValues } from './timing-plan'
import { DAY_TYPE_LABELS, overlapMinutes, windowMinutes } from './time-of-day'
import { kinematicYellowS } from './yellow'

export type TimingField = keyof TimingValues | keyof PlanWindow

export interface TimingIssue {
  path: (string | number)[]
  message: string
  severity: 'error' | 'warning'
  source: string
}

export interface TimingCheckContext {
  /** Length of the crosswalk across the bus street, metres. */
  crossingDistanceM: number
  /** Shortest walk interval this intersection allows: 7 s, or down to 4 s where allowed. */
  minPedWalkS?: number
  /** Speed limit of an approach, when the check runs for one (adds the kinematic yellow check). */
  approachSpeedKmh?: number
}

const s = (x: number) => `${Number(x.toFixed(1))} s`
/** Rounded up to 0.1 s so that the value shown as the requirement always passes the check. */
const ceil1 = (x: number) => Math.ceil(x * 10 - 1e-9) / 10
const EPS = 1e-9

export function checkTiming(p: TimingValues, ctx: TimingCheckContext): TimingIssue[] {
  const issues: TimingIssue[] = []
  const error = (field: TimingField, message: string, source: string) => issues.push({ path: [field], message, severity: 'error', source })
  const warn = (field: TimingField, message: string, source: string) => issues.push({ path: [field], message, severity: 'warning', source })

  if (p.yellowS < YELLOW_MIN_S - EPS || p.yellowS > YELLOW_MAX_S + EPS) {
    error('yellowS', `Yellow change of ${s(p.yellowS)} is outside the usual ${YELLOW_MIN_S}-${YELLOW_MAX_S} s range.`, SOURCES.yellow)
  } else if (ctx.approachSpeedKmh) {
    const needed = kinematicYellowS({ speedKmh: ctx.approachSpeedKmh })
    if (p.yellowS + EPS < Math.min(needed, YELLOW_MAX_S) - 0.05) {
      warn('yellowS', `At ${ctx.approachSpeedKmh} km/h the kinematic formula asks for about ${s(needed)} of yellow (level road); this plan has ${s(p.yellowS)}.`, SOURCES.yellow)
    }
  }
  if (p.redClearanceS > RED_CLEARANCE_MAX_S + EPS) {
    warn('redClearanceS', `Red clearance of ${s(p.redClearanceS)} is longer than ${RED_CLEARANCE_MAX_S} s.`, SOURCES.redClearance)
  }

  const cross = crossGreenS(p)
  const inter = intergreenS(p)
  if (cross <= EPS) {
    error('busGreenS', `Bus-street green ${s(p.busGreenS)} plus two intergreens of ${s(inter)} take ${s(p.busGreenS + 2 * inter)} of the ${s(p.cycleS)} cycle and leave no cross-street green.`, SOURCES.cycleSum)
  } else if (cross + EPS < p.crossMinGreenS) {
    error('busGreenS', `Cross-street green would be ${s(cross)} (cycle - bus green - intergreens), below its minimum green of ${s(p.crossMinGreenS)}.`, SOURCES.minGreen)
  }
  if (p.crossMinGreenS < MIN_GREEN_LOWEST_S - EPS) {
    warn('crossMinGreenS', `A minimum green of ${s(p.crossMinGreenS)} is below the usual lowest value of ${MIN_GREEN_LOWEST_S} s.`, SOURCES.minGreen)
  }
  if (p.busGreenS < MIN_GREEN_LOWEST_S - EPS) {
    warn('busGreenS', `A bus-street green of ${s(p.busGreenS)} is below the usual lowest minimum green of ${MIN_GREEN_LOWEST_S} s.`, SOURCES.minGreen)
  }

  if (p.offsetS >= p.cycleS - EPS) {
    error('offsetS', `The offset (${s(p.offsetS)}) must be shorter than the cycle (${s(p.cycleS)}).`, SOURCES.cycleSum)
  }
  if (p.cycleS < CYCLE_USUAL_MIN_S || p.cycleS > CYCLE_USUAL_MAX_S) {
    warn('cycleS', `A ${s(p.cycleS)} cycle is outside the usual ${CYCLE_USUAL_MIN_S}-${CYCLE_USUAL_MAX_S} s for coordinated urban signals.`, SOURCES.commonPractice)
  }

  const minWalk = ctx.minPedWalkS ?? PED_WALK_DEFAULT_MIN_S
  if (p.pedWalkS + EPS < minWalk) {
    error('pedWalkS', `Walk interval of ${s(p.pedWalkS)} is shorter than the ${s(minWalk)} minimum set for this intersection.`, SOURCES.pedestrian)
  }
  const clearanceNeeded = ctx.crossingDistanceM / PED_CLEARANCE_SPEED_M_PER_S
  if (p.pedClearanceS + EPS < clearanceNeeded) {
    error('pedClearanceS', `Pedestrian clearance of ${s(p.pedClearanceS)} is shorter than the ${s(ceil1(clearanceNeeded))} needed to cross ${ctx.crossingDistanceM} m at 1.07 m/s (3.5 ft/s).`, SOURCES.pedestrian)
  }
  const totalNeeded = ctx.crossingDistanceM / PED_TOTAL_SPEED_M_PER_S
  if (p.pedWalkS + p.pedClearanceS + EPS < totalNeeded) {
    warn('pedClearanceS', `Walk plus clearance (${s(p.pedWalkS + p.pedClearanceS)}) is shorter than the ${s(ceil1(totalNeeded))} a slower walker needs for ${ctx.crossingDistanceM} m at 0.91 m/s (3.0 ft/s), before any push-button setback.`, SOURCES.pedestrian)
  }
  if (p.pedConcurrent && cross > EPS && cross + EPS < p.pedWalkS + p.pedClearanceS) {
    // Conservative: the walk and the flashing clearance end by the end of the cross-street green.
    error('busGreenS', `Walk plus pedestrian clearance (${s(p.pedWalkS + p.pedClearanceS)}) does not fit in the cross-street green of ${s(cross)} they run with.`, SOURCES.pedestrian)
  }
  return issues
}

/**
 * Checks that the plans of one intersection do not claim the same day type and time at once,
 * and that names are unique. Paths are [planIndex, field].
 */
export function checkPlanSchedule(plans: readonly PlanWindow[]): TimingIssue[] {
  const issues: TimingIssue[] = []
  plans.forEach((p, i) => {
    if (windowMinutes(p) === 0) {
      issues.push({ path: [i, 'endTime'], message: `Plan "${p.name}" has no time window: use 00:00 to 24:00 for the whole day.`, severity: 'error', source: SOURCES.commonPractice })
    }
    for (let j = 0; j < i; j++) {
      const q = plans[j]
      if (q.name.trim().toLowerCase() === p.name.trim().toLowerCase()) {
        issues.push({ path: [i, 'name'], message: `Another plan is already called "${q.name}".`, severity: 'error', source: SOURCES.commonPractice })
      }
      const days = p.dayTypes.filter((d) => q.dayTypes.includes(d))
      if (days.length && overlapMinutes(p, q) > 0) {
        issues.push({
          path: [i, 'startTime'],
          message: `Plan "${p.name}" (${p.startTime}-${p.endTime}) overlaps plan "${q.name}" (${q.startTime}-${q.endTime}) on ${days.map((d) => DAY_TYPE_LABELS[d]).join(', ')}; only one plan can be in force at a time.`,
          severity: 'error',
          source: SOURCES.commonPractice,
        })
      }
    }
  })
  return issues
}

export const errorsOf = (issues: TimingIssue[]) => issues.filter((i) => i.severity === 'error')
export const warningsOf = (issues: TimingIssue[]) => issues.filter((i) => i.severity === 'warning')

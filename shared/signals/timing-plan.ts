// A timing plan of a signalised intersection, seen as two phases in one ring:
//
//   | bus-street green | yellow | red clearance | cross-street green | yellow | red clearance |
//   0                                                                                  cycleS
//
// The bus street is the street the corridor runs on. Both phases use the same yellow change and
// red clearance intervals, so the intergreen of each phase is yellowS + redClearanceS and the
// cross-street green is derived: crossGreenS = cycleS - busGreenS - 2 * (yellowS + redClearanceS).
// Pedestrians crossing the bus street (the crosswalk whose length is the intersection's crossing
// distance) walk with the cross-street green when pedConcurrent is true. offsetS is the start of
// the bus-street green after the corridor's common reference time, 0 <= offsetS < cycleS.

import type { DayType, TimeWindow } from './time-of-day'
import { inWindow } from './time-of-day'

export interface TimingValues {
  cycleS: number
  busGreenS: number
  yellowS: number
  redClearanceS: number
  crossMinGreenS: number
  pedWalkS: number
  pedClearanceS: number
  offsetS: number
  pedConcurrent: boolean
}

export interface PlanWindow extends TimeWindow {
  name: string
  dayTypes: readonly DayType[]
}

export type TimingPlanValues = TimingValues & PlanWindow

export function intergreenS(p: Pick<TimingValues, 'yellowS' | 'redClearanceS'>): number {
  return p.yellowS + p.redClearanceS
}

export function crossGreenS(p: Pick<TimingValues, 'cycleS' | 'busGreenS' | 'yellowS' | 'redClearanceS'>): number {
  return p.cycleS - p.busGreenS - 2 * intergreenS(p)
}

/** Share of the cycle that is bus-street green (g/C). */
export function busGreenRatio(p: Pick<TimingValues, 'cycleS' | 'busGreenS'>): number {
  return p.busGreenS / p.cycleS
}

/** The plan in force on a day type at a minute of the day, or undefined where no plan covers it. */
export function planInForce<P extends PlanWindow>(plans: readonly P[], dayType: DayType, minuteOfDay: number): P | undefined {
  return plans.find((p) => p.dayTypes.includes(dayType) && inWindow(p, minuteOfDay))
}

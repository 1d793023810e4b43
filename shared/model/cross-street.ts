/**
 * What priority costs the cross street, and what it gives the cars of the bus approach.
 *
 * The bus phase's red holds the cross street's effective green: g_x = C - g - lost time. What a
 * grant may take is g_x - max(minimum green, pedestrian walk + clearance): the pedestrians
 * crossing the main street walk with the cross street, and their walk and clearance must fit in
 * its green whatever priority does.
 *
 * A grant of T s changes one or two cycles of each stream:
 *   cross street, green extension: its red is T longer and its green T shorter (taken at the start);
 *   cross street, early green:     its green ends T early, the following red is T longer;
 *   bus approach, green extension: its green is T longer, the next red T shorter;
 *   bus approach, early green:     its red is T shorter, its green T longer.
 * The extra (or saved) delay is the area between the point-queue counts with and without the
 * grant until the queues coincide again (exact for deterministic arrivals, cumulative-counts.ts).
 */
import { redGreen } from './cumulative-counts'
import type { PriorityAction } from '../schemas/model'

export function crossStreetGreenS(cycleS: number, busGreenS: number, lostTimeS: number): number {
  return cycleS - busGreenS - lostTimeS
}

export function crossStreetMinimumS(minGreenS: number, pedWalkS: number, pedClearanceS: number): number {
  return Math.max(minGreenS, pedWalkS + pedClearanceS)
}

export function availableGreenS(crossGreenS: number, minGreenS: number, pedWalkS: number, pedClearanceS: number): number {
  return Math.max(0, crossGreenS - crossStreetMinimumS(minGreenS, pedWalkS, pedClearanceS))
}

export interface GrantEffect {
  /** vehicle-seconds added (negative: saved) until recovery */
  extraVehS: number
  /** largest extra queue at the start of a green, veh */
  extraQueueVeh: number
  /** cycles from the grant until the queue is as it would have been */
  recoveryCycles: number
}

/**
 * @param changes [dRed0, dGreen0, dRed1, dGreen1, ...] to the cycles from the one the grant acts in
 * @param maxCycles stop there if the queue has not recovered (oversaturated stream)
 */
export function grantEffect(q: number, s: number, redS: number, greenS: number, changes: readonly number[], maxCycles: number): GrantEffect {
  let qBase = 0
  let qMod = 0
  let extraVehS = 0
  let extraQueueVeh = 0
  const changed = changes.length / 2
  for (let k = 0; k < maxCycles; k++) {
    const dr = k < changed ? changes[2 * k] : 0
    const dg = k < changed ? changes[2 * k + 1] : 0
    const base = redGreen(q, s, qBase, redS, greenS)
    const mod = redGreen(q, s, qMod, redS + dr, greenS + dg)
    extraVehS += mod.area - base.area
    extraQueueVeh = Math.max(extraQueueVeh, mod.queueAtGreen - base.queueAtGreen)
    qBase = base.queueAtEnd
    qMod = mod.queueAtEnd
    if (k + 1 >= changed && Math.abs(qMod - qBase) < 1e-9) return { extraVehS, extraQueueVeh, recoveryCycles: k + 1 }
  }
  return { extraVehS, extraQueueVeh, recoveryCycles: maxCycles }
}

export function crossStreetChanges(action: PriorityAction, takenS: number): number[] {
  if (action === 'green-extension') return [takenS, -takenS]
  if (action === 'early-green') return [0, -takenS, takenS, 0]
  return []
}

export function busApproachChanges(action: PriorityAction, takenS: number): number[] {
  if (action === 'green-extension') return [0, takenS, -takenS, 0]
  if (action === 'early-green') return [-takenS, takenS]
  return []
}

// Rules for a corridor approach that both sides check: where its stop may be, and the defaults
// of the approach data.

/**
 * Saturation flow default, veh/h/lane: the HCM base of 1900 pc/h/ln adjusted down for the heavy
 * vehicles, lane widths, parking and buses of an urban arterial [HCM base value from memory; the
 * adjustment to 1800 is common practice]. Give a measured value where one exists.
 */
export const DEFAULT_SATURATION_FLOW_VEH_PER_HOUR_PER_LANE = 1800
/** Jam density default, veh/km/lane: about 7.5 m per stopped vehicle (common practice). */
export const DEFAULT_JAM_DENSITY_VEH_PER_KM_PER_LANE = 133
/** Where a bus asks for priority by default: about 10 s of travel at 50 km/h (a default of our own). */
export const DEFAULT_CHECK_IN_DISTANCE_M = 150

export const STOP_RELATIONS = ['near-side', 'far-side', 'none'] as const
export type StopRelation = (typeof STOP_RELATIONS)[number]

/** A stop "at" a signal lies within about a block of its stop line (common practice). */
export const STOP_MAX_GAP_M = 200
/** Stops and stop lines are located to within a few metres: a near-side stop may sit this far past the line. */
export const STOP_POSITION_TOLERANCE_M = 20

/** Why the stop cannot have this relation to the approach, or null when it can. */
export function stopRelationProblem(relation: StopRelation, stopDistanceM: number, approachDistanceM: number): string | null {
  if (relation === 'none') return null
  const gap = relation === 'near-side' ? approachDistanceM - stopDistanceM : stopDistanceM - approachDistanceM
  const where = relation === 'near-side' ? 'before' : 'after'
  if (gap < -STOP_POSITION_TOLERANCE_M) {
    return `A ${relation} stop lies ${where} the stop line; this stop is ${Math.round(-gap)} m on the other side.`
  }
  if (gap > STOP_MAX_GAP_M) return `The stop is ${Math.round(gap)} m from the stop line, too far to count as ${relation} (at most ${STOP_MAX_GAP_M} m).`
  return null
}

/** An intersection farther than this from the corridor's shape is not on it. */
export const SNAP_MAX_OFFSET_M = 150

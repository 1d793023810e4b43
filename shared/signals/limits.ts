// The limits the timing checks enforce, each with the source it comes from. Metres and seconds.

const FOOT_M = 0.3048

/** Yellow change interval range [P: ITE kinematic formula practice; MUTCD 2009 sec. 4D.26: 3 to 6 s]. */
export const YELLOW_MIN_S = 3
export const YELLOW_MAX_S = 6

/** Red clearance should not exceed 6 s [MUTCD 2009 sec. 4D.26, from memory]; a warning only. */
export const RED_CLEARANCE_MAX_S = 6

/** Walking speed for the pedestrian clearance time: 3.5 ft/s, about 1.07 m/s [P: MUTCD 2009 sec. 4E.06]. */
export const PED_CLEARANCE_SPEED_M_PER_S = 3.5 * FOOT_M

/** Slower walkers: (distance + button setback) / 3.0 ft/s should fit in walk + clearance [P: MUTCD 2009 sec. 4E.06]. */
export const PED_TOTAL_SPEED_M_PER_S = 3.0 * FOOT_M

/** Walk interval at least 7 s, 4 s where the agency allows it [P: MUTCD 2009 sec. 4E.06]. */
export const PED_WALK_DEFAULT_MIN_S = 7
export const PED_WALK_LOWEST_MIN_S = 4

/** Minimum green about 4-15 s by phase type [Signal Timing Manual 2nd ed., NCHRP Report 812, from memory]. */
export const MIN_GREEN_LOWEST_S = 4

/** Cycle lengths outside 40-180 s are unusual for urban coordinated signals (common practice). */
export const CYCLE_USUAL_MIN_S = 40
export const CYCLE_USUAL_MAX_S = 180

export const SOURCES = {
  yellow: 'MUTCD 2009 sec. 4D.26; ITE kinematic formula',
  redClearance: 'MUTCD 2009 sec. 4D.26 (from memory)',
  pedestrian: 'MUTCD 2009 sec. 4E.06',
  minGreen: 'Signal Timing Manual 2nd ed. (from memory)',
  cycleSum: 'definition of the cycle',
  commonPractice: 'common practice',
} as const

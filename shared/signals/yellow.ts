// Kinematic yellow change interval y = t + v / (2a + 2 G g) [P: ITE kinematic formula]:
// t perception-reaction time (s), v approach speed (m/s), a comfortable deceleration (m/s^2),
// G grade as a fraction (uphill positive), g = 9.81 m/s^2.

const G = 9.81

export interface YellowInputs {
  speedKmh: number
  reactionS?: number
  decelMps2?: number
  gradePercent?: number
}

/** Defaults: t = 1 s, a = 10 ft/s^2 (3.048 m/s^2), level road. */
export function kinematicYellowS({ speedKmh, reactionS = 1, decelMps2 = 3.048, gradePercent = 0 }: YellowInputs): number {
  const v = speedKmh / 3.6
  return reactionS + v / (2 * decelMps2 + 2 * (gradePercent / 100) * G)
}

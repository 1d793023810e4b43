/**
 * Signalised-intersection delay formulas of practice, for the cross street and as checks on the
 * kinematic-wave results.
 *   Uniform delay (HCM 2000 eq. 16-11 and later editions): d1 = 0.5 C (1 - g/C)^2 / (1 - min(1, X) g/C)
 *   Incremental delay (HCM 2000 eq. 16-12): d2 = 900 T [(X-1) + sqrt((X-1)^2 + 8 k I X / (c T))]
 *   Level of service by control delay (HCM 2010 / 6th ed.): A <= 10, B <= 20, C <= 35, D <= 55,
 *   E <= 80 s/veh, F above, or F when v/c > 1.
 *   Webster (1958): d = C(1-l)^2 / [2(1 - l x)] + x^2 / [2 q (1 - x)] - 0.65 (C/q^2)^(1/3) x^(2+5l),
 *   optimum cycle C0 = (1.5 L + 5) / (1 - Y).
 */
import type { LosGrade } from '../schemas/model'

export function uniformDelayS(cycleS: number, greenS: number, degreeOfSaturation: number): number {
  const l = greenS / cycleS
  return (0.5 * cycleS * (1 - l) ** 2) / (1 - Math.min(1, degreeOfSaturation) * l)
}

/**
 * @param capacityVehPerHour lane-group capacity c
 * @param periodH analysis period T
 * @param k incremental delay factor (0.5 for pretimed)
 * @param upstreamFilter I (1 for an isolated signal)
 */
export function incrementalDelayS(degreeOfSaturation: number, capacityVehPerHour: number, periodH = 0.25, k = 0.5, upstreamFilter = 1): number {
  const x = degreeOfSaturation
  if (capacityVehPerHour <= 0) return Infinity
  return 900 * periodH * ((x - 1) + Math.sqrt((x - 1) ** 2 + (8 * k * upstreamFilter * x) / (capacityVehPerHour * periodH)))
}

/** Control delay d1 + d2 with progression factor 1 and no initial queue. */
export function controlDelayS(p: { cycleS: number; greenS: number; arrivalVehPerHour: number; saturationVehPerHour: number; periodH?: number }): number {
  const capacity = (p.saturationVehPerHour * p.greenS) / p.cycleS
  if (capacity <= 0) return Infinity
  const x = p.arrivalVehPerHour / capacity
  return uniformDelayS(p.cycleS, p.greenS, x) + incrementalDelayS(x, capacity, p.periodH ?? 0.25)
}

const LOS_LIMITS: [number, LosGrade][] = [[10, 'A'], [20, 'B'], [35, 'C'], [55, 'D'], [80, 'E']]

export function levelOfService(controlDelayS: number, volumeToCapacity = 0): LosGrade {
  if (volumeToCapacity > 1) return 'F'
  for (const [limit, grade] of LOS_LIMITS) if (controlDelayS <= limit) return grade
  return 'F'
}

/**
 * @param greenRatio l = g / C
 * @param q arrivals, veh/s
 * @param s saturation flow, veh/s
 */
export function websterDelayS(cycleS: number, greenRatio: number, q: number, s: number): number {
  const l = greenRatio
  const x = q / (l * s)
  return (cycleS * (1 - l) ** 2) / (2 * (1 - l * x)) + x ** 2 / (2 * q * (1 - x)) - 0.65 * Math.cbrt(cycleS / q ** 2) * x ** (2 + 5 * l)
}

/** @param lostTimeS L, total lost time per cycle; @param flowRatioSum Y, sum of critical q/s */
export function websterCycleS(lostTimeS: number, flowRatioSum: number): number {
  return (1.5 * lostTimeS + 5) / (1 - flowRatioSum)
}

import { describe, expect, it } from 'vitest'
import { backwardWaveSpeedKmh, volumeMatching } from '../../../server/services/realtime/calibration'
import { evaluateApproach } from '../../../shared/model/approach'
import { approachBody } from '../../../shared/schemas/model'

describe('calibration helpers', () => {
  it('finds the backward wave speed that gives a saturation flow (triangular diagram capacity)', () => {
    // Capacity of the triangular diagram q = v w kj / (v + w) (Newell 1993; Daganzo 1994), solved
    // for w: 1800 veh/h/lane at v = 50 km/h, kj = 133 veh/km: w = 1800 x 50 / (50 x 133 - 1800) = 18.557 km/h.
    const w = backwardWaveSpeedKmh(1800, 50, 133)
    expect(w).toBeCloseTo(90_000 / 4850, 9)
    expect((50 * w * 133) / (50 + w)).toBeCloseTo(1800, 9)
    // REFERENCES.md worked value: v = 60, w = 20, kj = 120 gives 1800 veh/h; back again gives w = 20.
    expect(backwardWaveSpeedKmh(1800, 60, 120)).toBeCloseTo(20, 9)
  })

  it('finds the volume at which the model gives an observed delay, and none beyond reach', () => {
    const input = approachBody.parse({
      approach: { lanes: 1, arrivalFlowVehPerHour: 400 },
      signal: { cycleS: 90, effectiveGreenS: 45 },
      priority: { strategy: 'none' },
    })
    const delayAt = (v: number) => evaluateApproach({ ...input, approach: { ...input.approach, arrivalFlowVehPerHour: v } }, { phaseStepS: 1 }).bus.baseline.meanDelayS
    // The delay the model gives at 700 veh/h is found again from 400 veh/h, to the 10 veh/h it is rounded to.
    const target = delayAt(700)
    expect(target).toBeGreaterThan(delayAt(400))
    const match = volumeMatching(input, target)!
    expect(Math.abs(match.volume - 700)).toBeLessThanOrEqual(20)
    expect(match.delayS).toBeCloseTo(target, 0)
    // More delay than the signal causes at twice the volume, or less than at half: no suggestion.
    expect(volumeMatching(input, 500)).toBeNull()
    expect(volumeMatching(input, delayAt(200) - 2)).toBeNull()
  })
})

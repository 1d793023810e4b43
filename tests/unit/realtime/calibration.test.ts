import { describe, expect, it } from 'vitest'
import { volumeMatching } from '../../../server/services/realtime/calibration'
import { evaluateApproach } from '../../../shared/model/approach'
import { approachBody } from '../../../shared/schemas/model'

describe('calibration helpers', () => {
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

import { describe, expect, it } from 'vitest'
import { incrementalDelayS, levelOfService, stopPenaltyS, websterCycleS, websterDelayS } from '../../shared/model'

describe('HCM incremental delay', () => {
  // HCM 2000 eq. 16-12 (from memory): d2 = 900 T [(X-1) + sqrt((X-1)^2 + 8 k I X / (c T))],
  // k = 0.5, I = 1, T = 0.25 h, c = 900 veh/h: X = 0.9 gives 13.78 s; X = 1.1 gives 61.18 s.
  it('is 13.78 s at X = 0.9 and 61.18 s at X = 1.1', () => {
    expect(incrementalDelayS(0.9, 900, 0.25, 0.5, 1)).toBeCloseTo(13.78, 2)
    expect(incrementalDelayS(1.1, 900, 0.25, 0.5, 1)).toBeCloseTo(61.18, 2)
  })
})

describe('signalised level of service', () => {
  // HCM 2010 and 6th ed. exhibit, as reproduced in agency reports: A <= 10, B <= 20, C <= 35,
  // D <= 55, E <= 80, F > 80 s/veh or v/c > 1 (10.0 -> A, 10.1 -> B).
  it.each([
    [0, 'A'], [10.0, 'A'], [10.1, 'B'], [20, 'B'], [20.1, 'C'], [35, 'C'], [35.1, 'D'],
    [55, 'D'], [55.1, 'E'], [80, 'E'], [80.1, 'F'], [300, 'F'],
  ] as const)('%s s/veh is %s', (delay, grade) => {
    expect(levelOfService(delay)).toBe(grade)
  })

  it('is F whenever v/c exceeds 1', () => {
    expect(levelOfService(5, 1.01)).toBe('F')
    expect(levelOfService(5, 1)).toBe('A')
  })
})

describe('Webster', () => {
  // Webster 1958, Road Research Technical Paper 39: C = 60 s, l = 0.5, q = 0.2 veh/s,
  // s = 0.5 veh/s (x = 0.8): 12.5 + 8.0 - 2.73 = 17.77 s; C0 = (1.5 L + 5)/(1 - Y), L = 16 s,
  // Y = 0.5 -> 58 s.
  it('gives 17.77 s delay and a 58 s optimum cycle', () => {
    expect(websterDelayS(60, 0.5, 0.2, 0.5)).toBeCloseTo(17.77, 2)
    expect(websterCycleS(16, 0.5)).toBeCloseTo(58, 9)
  })
})

describe('bus time lost per stop', () => {
  // TCQSM 3rd ed., TCRP Report 165, ch. 6 (from memory): v/(2a) + v/(2d), a = d = 4.0 ft/s^2
  // (1.2 m/s^2), v = 44 ft/s (30 mph): 11 s.
  it('is 11 s from 30 mph at 4 ft/s^2', () => {
    const ft = 0.3048
    expect(stopPenaltyS(44 * ft, 4 * ft, 4 * ft)).toBeCloseTo(11, 9)
  })
})

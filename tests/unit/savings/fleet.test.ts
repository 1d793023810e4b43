import { describe, expect, it } from 'vitest'
import { cycleTimeMin, fleetEffect, vehiclesRequired } from '../../../shared/savings/fleet'

describe('peak vehicles of a route', () => {
  it('needs 5 buses for a 65-minute round trip with 10% layover at a 15-minute headway', () => {
    // Common practice; a standard transit-planning worked example: cycle = 65 + 6.5 = 71.5,
    // written as 72 min in a schedule; 72 / 15 = 4.8 -> 5 buses.
    expect(cycleTimeMin(65, 0.1)).toBe(72)
    expect(vehiclesRequired(72, 15)).toBe(5)
  })

  it('does not count a whole ratio that floating point lands a hair above as one more bus', () => {
    // 60 x 1.1 is 66.00000000000001 in floating point: still 66 minutes.
    expect(cycleTimeMin(60, 0.1)).toBe(66)
    // 60 min at a 15-min headway: exactly 4 buses (hand-checked).
    expect(vehiclesRequired(60, 15)).toBe(4)
    expect(vehiclesRequired(60.0000000001, 15)).toBe(4)
  })

  it('frees a bus only when the saving brings the cycle down past a multiple of the headway', () => {
    // Hand-checked: 65 - 10 = 55 min -> 55 x 1.1 = 60.5 -> 61 min -> ceil(61 / 15) = 5, no bus freed;
    // 65 - 11 = 54 min -> 59.4 -> 60 min -> 60 / 15 = 4 buses, one bus out of the peak fleet.
    expect(fleetEffect({ roundTripMin: 65, headwayMin: 15, layoverShare: 0.1, savedMin: 10 })).toEqual({
      cycleBeforeMin: 72, cycleAfterMin: 61, before: 5, after: 5, busSaved: false,
    })
    expect(fleetEffect({ roundTripMin: 65, headwayMin: 15, layoverShare: 0.1, savedMin: 11 })).toEqual({
      cycleBeforeMin: 72, cycleAfterMin: 60, before: 5, after: 4, busSaved: true,
    })
  })

  it('refuses a headway of zero', () => {
    expect(() => vehiclesRequired(72, 0)).toThrow(/headway/)
  })
})

import { describe, expect, it } from 'vitest'
import { kinematicYellowS } from '../../../shared/signals/yellow'
import { inWindow, minutesOfDay, overlapMinutes, windowMinutes } from '../../../shared/signals/time-of-day'
import { planInForce } from '../../../shared/signals/timing-plan'
import { PED_CLEARANCE_SPEED_M_PER_S } from '../../../shared/signals/limits'

describe('kinematicYellowS', () => {
  // y = t + v / (2a + 2 G g); t = 1 s, a = 10 ft/s^2, level, v = 66 ft/s -> 4.3 s [P: ITE kinematic formula, REFERENCES.md].
  it('gives 4.3 s at 66 ft/s on a level road', () => {
    const speedKmh = 66 * 0.3048 * 3.6
    expect(kinematicYellowS({ speedKmh })).toBeCloseTo(4.3, 1)
  })
  it('needs less yellow uphill and more downhill', () => {
    expect(kinematicYellowS({ speedKmh: 50, gradePercent: 4 })).toBeLessThan(kinematicYellowS({ speedKmh: 50 }))
    expect(kinematicYellowS({ speedKmh: 50, gradePercent: -4 })).toBeGreaterThan(kinematicYellowS({ speedKmh: 50 }))
  })
})

describe('pedestrian walking speed', () => {
  // 3.5 ft/s is about 1.07 m/s [P: MUTCD 2009 sec. 4E.06].
  it('is 3.5 ft/s in metres per second', () => {
    expect(PED_CLEARANCE_SPEED_M_PER_S).toBeCloseTo(1.0668, 4)
  })
})

describe('time windows', () => {
  it('parse HH:MM and refuse other forms', () => {
    expect(minutesOfDay('07:30')).toBe(450)
    expect(minutesOfDay('24:00')).toBe(1440)
    expect(minutesOfDay('24:01')).toBeNaN()
    expect(minutesOfDay('7:30')).toBeNaN()
  })
  it('run past midnight when the end is before the start', () => {
    const night = { startTime: '22:00', endTime: '05:00' }
    expect(windowMinutes(night)).toBe(420)
    expect(inWindow(night, 23 * 60)).toBe(true)
    expect(inWindow(night, 4 * 60 + 59)).toBe(true)
    expect(inWindow(night, 5 * 60)).toBe(false)
    expect(inWindow(night, 25 * 60)).toBe(true)
    expect(overlapMinutes(night, { startTime: '04:00', endTime: '06:00' })).toBe(60)
  })
  it('find the plan in force', () => {
    const plans = [
      { name: 'AM', dayTypes: ['weekday'] as const, startTime: '07:00', endTime: '09:00' },
      { name: 'Night', dayTypes: ['weekday', 'saturday'] as const, startTime: '22:00', endTime: '07:00' },
    ]
    expect(planInForce(plans, 'weekday', 8 * 60)?.name).toBe('AM')
    expect(planInForce(plans, 'saturday', 3 * 60)?.name).toBe('Night')
    expect(planInForce(plans, 'sunday', 3 * 60)).toBeUndefined()
    expect(planInForce(plans, 'weekday', 12 * 60)).toBeUndefined()
  })
})

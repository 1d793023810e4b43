import { describe, expect, it } from 'vitest'
import { checkPlanSchedule, checkTiming, errorsOf, warningsOf, type TimingIssue } from '../../../shared/signals/checks'
import { crossGreenS, type TimingPlanValues } from '../../../shared/signals/timing-plan'

// A plan that passes every check: 100 s cycle, 52 s bus green, 4 s yellow + 2 s red clearance per
// phase, so the cross street gets 100 - 52 - 2 x 6 = 36 s of green.
const ok: TimingPlanValues = {
  name: 'AM peak', dayTypes: ['weekday'], startTime: '07:00', endTime: '09:00',
  cycleS: 100, busGreenS: 52, yellowS: 4, redClearanceS: 2, crossMinGreenS: 10,
  pedWalkS: 7, pedClearanceS: 15, offsetS: 0, pedConcurrent: true,
}
const ctx = { crossingDistanceM: 16, minPedWalkS: 7 }
const fields = (issues: TimingIssue[]) => issues.map((i) => i.path.join('.'))

describe('derived cross-street green', () => {
  it('is the cycle less the bus green and both intergreens', () => {
    expect(crossGreenS(ok)).toBe(36)
    expect(crossGreenS({ cycleS: 90, busGreenS: 40, yellowS: 3.5, redClearanceS: 1.5 })).toBe(40)
  })
})

describe('checkTiming', () => {
  it('passes a plan that meets every rule', () => {
    expect(checkTiming(ok, ctx)).toEqual([])
  })

  // Yellow change 3-6 s [P: MUTCD 2009 sec. 4D.26 range; ITE kinematic practice, REFERENCES.md].
  it.each([[2.9, true], [3, false], [6, false], [6.1, true]])('yellow of %s s is an error: %s', (yellowS, bad) => {
    const cross = crossGreenS({ ...ok, yellowS })
    expect(cross).toBeGreaterThan(ok.pedWalkS + ok.pedClearanceS)
    expect(fields(errorsOf(checkTiming({ ...ok, yellowS }, ctx))).includes('yellowS')).toBe(bad)
  })

  // Kinematic yellow y = t + v/(2a + 2Gg): t = 1 s, a = 10 ft/s^2, level, v = 66 ft/s -> 4.3 s
  // [P: ITE kinematic formula, REFERENCES.md]. 66 ft/s = 72.42 km/h.
  it('warns when yellow is shorter than the kinematic formula asks for at the approach speed', () => {
    const speedKmh = 66 * 0.3048 * 3.6
    const short = checkTiming({ ...ok, yellowS: 3.5 }, { ...ctx, approachSpeedKmh: speedKmh })
    expect(errorsOf(short)).toEqual([])
    expect(warningsOf(short)[0]).toMatchObject({ path: ['yellowS'], severity: 'warning' })
    expect(warningsOf(short)[0].message).toContain('4.3 s')
    expect(checkTiming({ ...ok, yellowS: 4.3 }, { ...ctx, approachSpeedKmh: speedKmh })).toEqual([])
  })

  // Pedestrian clearance >= crossing distance / 3.5 ft/s (1.0668 m/s) [P: MUTCD 2009 sec. 4E.06].
  // 16 m / 1.0668 m/s = 15.0 s; 20 m -> 18.75 s.
  it('refuses a pedestrian clearance shorter than the crossing distance at 3.5 ft/s', () => {
    expect(fields(errorsOf(checkTiming({ ...ok, pedClearanceS: 15 }, ctx)))).toEqual([])
    const short = errorsOf(checkTiming({ ...ok, pedClearanceS: 18.7 }, { ...ctx, crossingDistanceM: 20 }))
    expect(fields(short)).toEqual(['pedClearanceS'])
    expect(short[0].message).toContain('18.8 s')
    expect(short[0].source).toContain('4E.06')
    expect(errorsOf(checkTiming({ ...ok, pedClearanceS: 18.75 }, { ...ctx, crossingDistanceM: 20 }))).toEqual([])
  })

  // Walk at least 7 s, 4 s where allowed [P: MUTCD 2009 sec. 4E.06].
  it('refuses a walk below the minimum set for the intersection, 7 s by default and 4 s where allowed', () => {
    expect(fields(errorsOf(checkTiming({ ...ok, pedWalkS: 6 }, { crossingDistanceM: 16 })))).toEqual(['pedWalkS'])
    expect(fields(errorsOf(checkTiming({ ...ok, pedWalkS: 6 }, { crossingDistanceM: 16, minPedWalkS: 4 })))).toEqual([])
    expect(fields(errorsOf(checkTiming({ ...ok, pedWalkS: 3.9 }, { crossingDistanceM: 16, minPedWalkS: 4 })))).toEqual(['pedWalkS'])
  })

  // (distance + setback) / 3.0 ft/s <= walk + clearance [P: MUTCD 2009 sec. 4E.06]; the setback is
  // not recorded, so it is a warning on the distance alone. 40 m: 40 / 0.9144 = 43.7 s needed in all,
  // while the clearance rule asks for 40 / 1.0668 = 37.5 s.
  it('warns when walk plus clearance is shorter than the crossing at 3.0 ft/s', () => {
    const wide = { ...ok, busGreenS: 40, pedWalkS: 4, pedClearanceS: 37.5 }
    const issues = checkTiming(wide, { crossingDistanceM: 40, minPedWalkS: 4 })
    expect(errorsOf(issues)).toEqual([])
    expect(warningsOf(issues)).toMatchObject([{ path: ['pedClearanceS'], severity: 'warning' }])
    expect(warningsOf(issues)[0].message).toContain('43.8 s')
    expect(checkTiming({ ...wide, pedWalkS: 6.3 }, { crossingDistanceM: 40, minPedWalkS: 4 })).toEqual([])
  })

  // Splits and intergreens add up to the cycle: the cross street gets what is left [definition].
  it('refuses a bus green that leaves no cross-street green', () => {
    const issues = errorsOf(checkTiming({ ...ok, busGreenS: 88 }, ctx))
    expect(fields(issues)).toEqual(['busGreenS'])
    expect(issues[0].message).toContain('leave no cross-street green')
  })

  // Minimum green respected [M: Signal Timing Manual 2nd ed., NCHRP Report 812, from memory].
  it('refuses a cross-street green below its minimum', () => {
    const issues = errorsOf(checkTiming({ ...ok, busGreenS: 52, crossMinGreenS: 40, pedConcurrent: false }, ctx))
    expect(fields(issues)).toEqual(['busGreenS'])
    expect(issues[0].message).toContain('36 s')
    expect(issues[0].message).toContain('40 s')
    expect(warningsOf(checkTiming({ ...ok, crossMinGreenS: 3 }, ctx)).map((i) => i.path[0])).toEqual(['crossMinGreenS'])
  })

  // Walk and clearance across the bus street run with the cross-street green (conservative: both end by
  // the end of that green) [P: MUTCD 2009 sec. 4E.06 intervals; the fit rule is common practice].
  it('refuses concurrent pedestrian intervals that do not fit in the cross-street green', () => {
    const plan = { ...ok, busGreenS: 70 } // cross green 100 - 70 - 12 = 18 s < 7 + 15 = 22 s
    expect(crossGreenS(plan)).toBe(18)
    expect(fields(errorsOf(checkTiming(plan, ctx)))).toEqual(['busGreenS'])
    expect(errorsOf(checkTiming(plan, ctx))[0].message).toContain('22 s')
    expect(errorsOf(checkTiming({ ...plan, pedConcurrent: false }, ctx))).toEqual([])
  })

  it('refuses an offset of a whole cycle or more', () => {
    expect(fields(errorsOf(checkTiming({ ...ok, offsetS: 100 }, ctx)))).toEqual(['offsetS'])
    expect(errorsOf(checkTiming({ ...ok, offsetS: 99.5 }, ctx))).toEqual([])
  })

  // Red clearance up to 6 s [M: MUTCD 2009 sec. 4D.26, from memory] and cycles of 40-180 s (common practice): warnings.
  it('warns about a long red clearance and an unusual cycle without refusing them', () => {
    const issues = checkTiming({ ...ok, cycleS: 200, busGreenS: 100, redClearanceS: 6.5 }, ctx)
    expect(errorsOf(issues)).toEqual([])
    expect(fields(warningsOf(issues)).sort()).toEqual(['cycleS', 'redClearanceS'])
  })
})

describe('checkPlanSchedule', () => {
  const plan = (name: string, startTime: string, endTime: string, dayTypes: TimingPlanValues['dayTypes'] = ['weekday']) =>
    ({ name, startTime, endTime, dayTypes })

  it('accepts plans that cover the day one after the other, with one running past midnight', () => {
    expect(checkPlanSchedule([plan('AM', '07:00', '09:00'), plan('Midday', '09:00', '15:00'), plan('Night', '22:00', '07:00'),
      plan('Weekend', '00:00', '24:00', ['saturday', 'sunday'])])).toEqual([])
  })

  it('reports an overlap on the later plan, naming the earlier one and the day type', () => {
    const issues = checkPlanSchedule([plan('Night', '22:00', '07:30'), plan('AM', '07:00', '09:00', ['weekday', 'saturday'])])
    expect(issues).toHaveLength(1)
    expect(issues[0].path).toEqual([1, 'startTime'])
    expect(issues[0].message).toContain('"Night"')
    expect(issues[0].message).toContain('Weekday')
    expect(issues[0].message).not.toContain('Saturday')
  })

  it('allows the same hours on different day types and refuses twin names and empty windows', () => {
    expect(checkPlanSchedule([plan('AM', '07:00', '09:00'), plan('Sat AM', '07:00', '09:00', ['saturday'])])).toEqual([])
    const issues = checkPlanSchedule([plan('AM', '07:00', '09:00'), plan('am', '10:00', '11:00'), plan('Odd', '12:00', '12:00')])
    expect(issues.map((i) => i.path)).toEqual([[1, 'name'], [2, 'endTime']])
  })
})

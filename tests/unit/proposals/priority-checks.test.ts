import { describe, expect, it } from 'vitest'
import { checkPriority, spareCrossGreenS, takenPerCycleS, type PlanForCheck } from '../../../shared/proposals/priority-checks'
import { DEFAULT_ROW_SETTINGS, type RowSettings } from '../../../shared/schemas/proposals'

// A 90 s two-phase plan worked by hand: intergreen 4 + 1 = 5 s per phase, so the cross-street
// green is 90 - 40 - 2 x 5 = 40 s (the cycle is the sum of greens and intergreens, by definition).
// Pedestrians crossing the bus street walk with it: 7 s walk (MUTCD 2009 sec. 4E.06 minimum) and
// 14 s clearance (15 m at 1.07 m/s = 3.5 ft/s, MUTCD 2009 sec. 4E.06), 21 s in all, above the
// 10 s minimum green; priority may take 40 - 21 = 19 s per cycle.
const plan: PlanForCheck = { name: 'AM peak', cycleS: 90, busGreenS: 40, yellowS: 4, redClearanceS: 1, crossMinGreenS: 10, pedWalkS: 7, pedClearanceS: 14, pedConcurrent: true }
const st = (o: Partial<RowSettings>): RowSettings => ({ ...DEFAULT_ROW_SETTINGS, ...o })
const errors = (s: RowSettings, plans = [plan]) => checkPriority(s, plans).filter((c) => c.severity === 'error').map((c) => c.path[0])

describe('priority limits against the timing plan', () => {
  it('spare cross-street green above the minimum green or walk + clearance', () => {
    expect(spareCrossGreenS(plan)).toBe(19)
    // Pedestrians served on their own phase: only the 10 s minimum green binds.
    expect(spareCrossGreenS({ ...plan, pedConcurrent: false })).toBe(30)
  })

  it('refuses an extension or early green longer than what the cross street can give', () => {
    expect(errors(st({ strategy: 'green-extension', maxExtensionS: 19 }))).toEqual([])
    expect(errors(st({ strategy: 'green-extension', maxExtensionS: 19.5 }))).toEqual(['maxExtensionS'])
    expect(errors(st({ strategy: 'early-green', maxEarlyGreenS: 20 }))).toEqual(['maxEarlyGreenS'])
    // The unused limit of another strategy is not checked.
    expect(errors(st({ strategy: 'early-green', maxExtensionS: 40, maxEarlyGreenS: 8 }))).toEqual([])
  })

  it('without lockout both grants can hit the same cross-street green', () => {
    expect(takenPerCycleS(st({ strategy: 'both', maxExtensionS: 10, maxEarlyGreenS: 10, lockoutCycles: 0 }))).toBe(20)
    expect(takenPerCycleS(st({ strategy: 'both', maxExtensionS: 10, maxEarlyGreenS: 10, lockoutCycles: 1 }))).toBe(10)
    expect(errors(st({ strategy: 'both', maxExtensionS: 10, maxEarlyGreenS: 10, lockoutCycles: 0 }))).toEqual(['lockoutCycles'])
    expect(errors(st({ strategy: 'both', maxExtensionS: 10, maxEarlyGreenS: 10, lockoutCycles: 1 }))).toEqual([])
  })

  it('checks every plan and names the one that breaks', () => {
    const tight = { ...plan, name: 'PM peak', busGreenS: 50 } // cross green 30, spare 9
    const found = checkPriority(st({ strategy: 'green-extension', maxExtensionS: 10 }), [plan, tight]).filter((c) => c.severity === 'error')
    expect(found).toHaveLength(1)
    expect(found[0].planName).toBe('PM peak')
    expect(found[0].message).toContain('at most 9 s')
  })

  it('refuses any priority where the cross street has nothing to spare', () => {
    const full = { ...plan, busGreenS: 59 } // cross green 21 = walk + clearance
    expect(errors(st({ strategy: 'both', maxExtensionS: 1, maxEarlyGreenS: 1 }), [full])).toEqual(['strategy'])
    expect(checkPriority(st({ strategy: 'none' }), [full])).toEqual([])
  })

  it('warns beyond the usual 10-15 s and without lockout (common practice)', () => {
    const w = checkPriority(st({ strategy: 'both', maxExtensionS: 16, maxEarlyGreenS: 12, lockoutCycles: 0 }), [{ ...plan, pedConcurrent: false }])
      .filter((c) => c.severity === 'warning').map((c) => c.path[0])
    expect(w).toEqual(['maxExtensionS', 'lockoutCycles'])
    expect(checkPriority(st({}), []).map((c) => c.severity)).toEqual(['warning'])
  })
})

describe('fitting limits to what the plans can spare', () => {
  it('lowers limits to the tightest plan, in whole seconds, and never raises one', async () => {
    const { fitToPlans } = await import('../../../shared/proposals/priority-checks')
    const tight = { ...plan, name: 'PM peak', busGreenS: 50.5 } // cross green 29.5, spare 8.5
    const fitted = fitToPlans(st({ strategy: 'both', maxExtensionS: 10, maxEarlyGreenS: 6 }), [plan, tight])
    expect(fitted).toMatchObject({ maxExtensionS: 8, maxEarlyGreenS: 6 })
    expect(errors(fitted, [plan, tight])).toEqual([])
    // Without lockout the two share one cross-street green: 8 + 8 > 8.5.
    const shared = fitToPlans(st({ strategy: 'both', maxExtensionS: 10, maxEarlyGreenS: 10, lockoutCycles: 0 }), [tight])
    expect(shared.maxExtensionS + shared.maxEarlyGreenS).toBeLessThanOrEqual(8)
    expect(errors(shared, [tight])).toEqual([])
    expect(fitToPlans(st({ strategy: 'both', maxExtensionS: 1 }), [{ ...plan, busGreenS: 59 }]).strategy).toBe('none')
    const untouched = st({ strategy: 'green-extension', maxExtensionS: 5, maxEarlyGreenS: 40 })
    expect(fitToPlans(untouched, [plan])).toEqual(untouched)
  })
})

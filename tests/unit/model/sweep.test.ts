import { describe, expect, it } from 'vitest'
import { checkApproach, evaluateApproach } from '../../../shared/model'
import { sweepApproach, sweepEvaluator, sweepGrid, withSettings } from '../../../shared/model/sweep'
import { recommendApproach, recommendPeriods } from '../../../shared/model/recommend'
import { approachBody, type ApproachBody, type ApproachInput, type ApproachResult } from '../../../shared/schemas/model'
import { LOS_RANK, NO_CITY_LIMITS, type CityLimits } from '../../../shared/schemas/city-limits'
import { gridValues, sweepPointCount, sweepRanges, type Objective, type SweepRangesBody, type SweepSettings } from '../../../shared/schemas/sweep'

const parse = (body: ApproachBody) => approachBody.parse(body)
const ranges = (body: SweepRangesBody = {}) => sweepRanges.parse(body)

// Invented approaches covering the model's branches: no stop, near-side and far-side stops,
// a long cycle, a busy cross street, an oversaturated bus approach.
const APPROACHES: Record<string, ApproachBody> = {
  plain: {},
  nearSide: { bus: { stop: { position: 'near-side', distanceM: 40, dwellS: 15 }, busesPerHour: 12 } },
  farSideLong: { signal: { cycleS: 120, effectiveGreenS: 55, lostTimeS: 8 }, bus: { stop: { position: 'far-side' } }, crossStreet: { arrivalFlowVehPerHour: 650 } },
  busyCross: { signal: { cycleS: 90, effectiveGreenS: 40 }, bus: { busesPerHour: 30 }, crossStreet: { arrivalFlowVehPerHour: 850 } },
  oversaturated: { approach: { arrivalFlowVehPerHour: 1000 } },
}

const FIGURE_TOL = 1e-8

function expectSameFigures(pt: ReturnType<typeof sweepApproach>['points'][number], r: ApproachResult) {
  const scale = (x: number) => FIGURE_TOL * Math.max(1, Math.abs(x))
  expect(Math.abs(pt.busSavingPerTripS - r.bus.meanSavingS)).toBeLessThan(scale(r.bus.meanSavingS))
  expect(Math.abs(pt.crossExtraDelayPerVehS - r.crossStreet.extraDelayPerVehS)).toBeLessThan(scale(r.crossStreet.extraDelayPerVehS))
  expect(Math.abs(pt.personDelayBalanceS - r.personDelayBalanceS)).toBeLessThan(scale(r.personDelayBalanceS))
  expect(Math.abs(pt.vcAfter - r.crossStreet.vcAfter)).toBeLessThan(scale(r.crossStreet.vcAfter))
  expect(Math.abs(pt.grantsPerHour - r.crossStreet.grantsPerHour)).toBeLessThan(scale(r.crossStreet.grantsPerHour))
  expect(pt.losAfter).toBe(r.crossStreet.losAfter)
}

describe('the sweep grid', () => {
  it('runs each limit from 0 to its cap and counts the points', () => {
    expect(gridValues(20, 1)).toHaveLength(21)
    expect(gridValues(5, 2)).toEqual([0, 2, 4, 5])
    const r = ranges()
    // 1 (no priority) + 21 x 8 (extension) + 21 x 8 (early green) + 21 x 21 x 8 (both): the issue's 21 x 21 x 4 x 2
    expect(sweepPointCount(r)).toBe(1 + 21 * 8 + 21 * 8 + 21 * 21 * 8)
    expect(sweepGrid(r)).toHaveLength(sweepPointCount(r))
    expect(new Set(sweepGrid(r).map((s) => JSON.stringify(s))).size).toBe(sweepPointCount(r))
  })

  it('refuses grids too large for one request, and repeated values, with the path', () => {
    const big = sweepRanges.safeParse({ stepS: 0.5, maxExtensionCapS: 60, maxEarlyGreenCapS: 60 })
    expect(big.success).toBe(false)
    expect(big.error!.issues[0].path).toEqual(['stepS'])
    expect(sweepRanges.safeParse({ lockoutCycles: [1, 1] }).error!.issues[0].path).toEqual(['lockoutCycles'])
    expect(sweepRanges.safeParse({ strategies: ['none'] }).error!.issues[0].path).toEqual(['strategies', 0])
  })
})

describe('every point is the exact solver’s answer', () => {
  for (const [name, body] of Object.entries(APPROACHES)) {
    it(`${name}: each setting of the grid equals a direct evaluation`, () => {
      const input = parse(body)
      // the full grid on one approach; a coarser one elsewhere keeps the test short
      const r = name === 'nearSide' ? ranges() : ranges({ stepS: 3, maxExtensionCapS: 18, maxEarlyGreenCapS: 18 })
      const sweep = sweepApproach(input, r)
      expect(sweep.points).toHaveLength(sweepPointCount(r))
      for (const pt of sweep.points) expectSameFigures(pt, evaluateApproach(withSettings(input, pt.settings), { solver: 'exact' }))
    })
  }

  it('shares the work: below saturation one run per value of each limit, not per pair', () => {
    const input = parse(APPROACHES.farSideLong)
    const sweep = sweepApproach(input, ranges())
    // no priority + at most 20 extensions + 20 early greens (0 is the no-priority run)
    expect(sweep.runs).toBeLessThanOrEqual(41)
    expect(sweep.baseline.availableGreenS).toBeGreaterThan(20)
  })

  it('marks off-grid settings exactly too', () => {
    const input = parse(APPROACHES.nearSide)
    const s: SweepSettings = { strategy: 'both', maxExtensionS: 7.5, maxEarlyGreenS: 4.25, lockoutCycles: 2, lateOnly: true }
    const sweep = sweepApproach(input, ranges({ strategies: ['both'], stepS: 10, maxExtensionCapS: 10, maxEarlyGreenCapS: 10 }))
    expect(sweep.points.length).toBe(1 + 4 * 8)
    expectSameFigures(sweepEvaluator(input).point(s), evaluateApproach(withSettings(input, s)))
  })
})

describe('the hard minimums of the timing', () => {
  it('a point breaks them exactly when the model refuses its settings', () => {
    for (const body of [APPROACHES.plain, APPROACHES.nearSide, { crossStreet: { minGreenS: 24, pedWalkS: 4, pedClearanceS: 10 } }]) {
      const input = parse(body)
      for (const pt of sweepApproach(input, ranges({ stepS: 2 })).points) {
        const refused = checkApproach(withSettings(input, pt.settings)).filter((v) => v.field.startsWith('priority.'))
        const hard = pt.violations.filter((v) => v.constraint === 'min-green' || v.constraint === 'ped-walk-clearance')
        expect(hard.length > 0, JSON.stringify(pt.settings)).toBe(refused.length > 0)
      }
    }
  })
})

// ---- brute force: every setting of the grid evaluated on its own, limits checked independently ----

function bruteForce(input: ApproachInput, r: ReturnType<typeof ranges>) {
  return sweepGrid(r).map((settings) => {
    const full = withSettings(input, settings)
    return { settings, refused: checkApproach(full).some((v) => v.field.startsWith('priority.')), result: evaluateApproach(full) }
  })
}

function bruteBest(all: ReturnType<typeof bruteForce>, limits: CityLimits, objective: Objective) {
  const usesE = (s: SweepSettings) => s.strategy === 'green-extension' || s.strategy === 'both'
  const usesA = (s: SweepSettings) => s.strategy === 'early-green' || s.strategy === 'both'
  const ok = all.filter(({ settings: s, refused, result: x }) => !refused
    && !(limits.maxExtensionS !== null && usesE(s) && s.maxExtensionS > limits.maxExtensionS)
    && !(limits.maxEarlyGreenS !== null && usesA(s) && s.maxEarlyGreenS > limits.maxEarlyGreenS)
    && !(s.strategy !== 'none' && s.lockoutCycles < limits.minLockoutCycles)
    // a street past a limit without priority may not get worse with it
    && !(limits.maxCrossVc !== null && x.crossStreet.vcAfter > Math.max(limits.maxCrossVc, x.crossStreet.vcBefore))
    && !(limits.worstLos !== null && LOS_RANK[x.crossStreet.losAfter] > Math.max(LOS_RANK[limits.worstLos], LOS_RANK[x.crossStreet.losBefore])))
  const value = (x: ApproachResult) => (objective === 'person-delay' ? x.personDelayBalanceS : x.bus.meanSavingS)
  return { feasible: ok, best: ok.length ? Math.max(...ok.map((o) => value(o.result))) : null, value }
}

const LIMIT_SETS: CityLimits[] = [
  NO_CITY_LIMITS,
  { maxCrossVc: 0.9, worstLos: 'C', maxExtensionS: 12, maxEarlyGreenS: 8, minLockoutCycles: 1 },
  { maxCrossVc: null, worstLos: null, maxExtensionS: 5, maxEarlyGreenS: null, minLockoutCycles: 2 },
  { maxCrossVc: 0.905, worstLos: null, maxExtensionS: null, maxEarlyGreenS: null, minLockoutCycles: 0 },
]

describe('the recommendation is the best setting of the grid', () => {
  for (const name of ['nearSide', 'busyCross'] as const) {
    it(`${name}: equals a brute-force search over the same grid, for each objective and set of limits`, () => {
      const input = parse(APPROACHES[name])
      const r = ranges({ stepS: 2 })
      const all = bruteForce(input, r)
      for (const limits of LIMIT_SETS) {
        for (const objective of ['person-delay', 'bus-saving'] as const) {
          const { recommendation: rec } = recommendApproach(input, r, limits, objective)
          const brute = bruteBest(all, limits, objective)
          expect(brute.best).not.toBeNull()
          expect(rec.feasible).toBe(true)
          expect(Math.abs(rec.objectiveValue - brute.best!)).toBeLessThan(1e-8 * Math.max(1, Math.abs(brute.best!)))
          // the recommended setting is itself one of the brute force's best
          const same = brute.feasible.find((o) => JSON.stringify(o.settings) === JSON.stringify(rec.settings))
          expect(same, `${objective} ${JSON.stringify(limits)}`).toBeDefined()
          expect(Math.abs(brute.value(same!.result) - brute.best!)).toBeLessThan(1e-8 * Math.max(1, Math.abs(brute.best!)))
        }
      }
    })
  }

  it('suggests no priority, and says why, when the cross street is past a limit already', () => {
    // 850 veh/h against 1800 veh/h x 50/90 of green: v/c 0.85 before any grant; every grant adds to it
    const input = parse(APPROACHES.busyCross)
    const { recommendation: rec, sweep } = recommendApproach(input, ranges({ stepS: 5 }), { ...NO_CITY_LIMITS, maxCrossVc: 0.8 }, 'person-delay')
    expect(sweep.baseline.vcBefore).toBeCloseTo(850 / (1800 * 50 / 90), 12)
    expect(sweep.points[0].violations).toEqual([])
    expect(sweep.points.filter((p) => p.grantsPerHour > 0).every((p) => p.violations.some((v) => v.constraint === 'max-vc'))).toBe(true)
    expect(rec.feasible).toBe(true)
    expect(rec.settings.strategy).toBe('none')
    expect(rec.binding[0]).toMatchObject({ setting: 'strategy', constraint: 'max-vc' })
    expect(rec.binding[0].detail).toMatch(/v\/c rises from 0\.85 to 0\.\d\d, already above the city’s limit of 0\.80/)
    expect(rec.summary).toMatch(/^No priority: /)
  })
})

describe('which constraint binds', () => {
  it('a tight pedestrian clearance caps the early green at the value worked out by hand', () => {
    // Cycle 60 s, bus-phase effective green 30 s, no lost time: the cross street has 60 - 30 = 30 s.
    // It needs max(minimum green 10 s, walk 7 s + clearance 17 s) = 24 s, so a grant may take
    // 30 - 24 = 6 s. An early green of 7 s would leave 23 s < 24 s of walk + clearance.
    const input = parse({ signal: { cycleS: 60, effectiveGreenS: 30, lostTimeS: 0 }, crossStreet: { minGreenS: 10, pedWalkS: 7, pedClearanceS: 17 } })
    const { recommendation: rec, sweep } = recommendApproach(input, ranges({ strategies: ['early-green'] }), NO_CITY_LIMITS, 'person-delay')
    expect(sweep.baseline.availableGreenS).toBe(6)
    expect(rec.settings).toMatchObject({ strategy: 'early-green', maxEarlyGreenS: 6 })
    expect(rec.binding).toHaveLength(1)
    expect(rec.binding[0]).toMatchObject({ setting: 'maxEarlyGreenS', constraint: 'ped-walk-clearance', message: 'early green capped at 6 s by pedestrian walk + clearance' })
    expect(rec.binding[0].detail).toContain('leaves the cross street 23 s of green, less than the pedestrian walk + clearance of 24 s')
    expect(rec.summary).toContain('Early green capped at 6 s by pedestrian walk + clearance.')
    // with both strategies the same 6 s caps each; no lockout would let one green lose 12 s
    const both = recommendApproach(input, ranges(), NO_CITY_LIMITS, 'person-delay').recommendation
    expect(both.settings).toMatchObject({ strategy: 'both', maxExtensionS: 6, maxEarlyGreenS: 6 })
    expect(both.binding.map((b) => `${b.setting}:${b.constraint}`)).toEqual(expect.arrayContaining(['maxExtensionS:ped-walk-clearance', 'maxEarlyGreenS:ped-walk-clearance']))
  })

  it('a long minimum green caps the extension instead', () => {
    // 30 s of cross-street green, minimum green 26 s above walk 4 s + clearance 10 s: 30 - 26 = 4 s
    const input = parse({ crossStreet: { minGreenS: 26, pedWalkS: 4, pedClearanceS: 10 } })
    const { recommendation: rec } = recommendApproach(input, ranges({ strategies: ['green-extension'] }), NO_CITY_LIMITS, 'bus-saving')
    expect(rec.settings).toMatchObject({ strategy: 'green-extension', maxExtensionS: 4 })
    expect(rec.binding[0]).toMatchObject({ setting: 'maxExtensionS', constraint: 'min-green', message: 'green extension capped at 4 s by the cross street’s minimum green' })
  })

  it('a cross-street v/c limit caps the extension where the curve crosses it', () => {
    const input = parse(APPROACHES.busyCross)
    const r = ranges({ strategies: ['green-extension'], lockoutCycles: [0], conditional: [false] })
    const free = sweepApproach(input, r).points
    const ext = (e: number) => free.find((p) => p.settings.maxExtensionS === e)!
    // the bus saving still grows from 4 to 5 s of extension, and so does the cross street's v/c
    expect(ext(5).busSavingPerTripS).toBeGreaterThan(ext(4).busSavingPerTripS)
    expect(ext(5).vcAfter).toBeGreaterThan(ext(4).vcAfter)
    const maxCrossVc = (ext(4).vcAfter + ext(5).vcAfter) / 2
    const { recommendation: rec } = recommendApproach(input, r, { ...NO_CITY_LIMITS, maxCrossVc }, 'bus-saving')
    expect(rec.settings.maxExtensionS).toBe(4)
    expect(rec.binding).toHaveLength(1)
    expect(rec.binding[0]).toMatchObject({ setting: 'maxExtensionS', constraint: 'max-vc' })
    expect(rec.binding[0].message).toBe(`green extension capped at 4 s by the city’s maximum cross-street v/c (${maxCrossVc.toFixed(2)})`)
    expect(rec.binding[0].detail).toMatch(/^with 5 s of extension: the cross street’s v\/c becomes/)
  })

  it('says when no limit binds', () => {
    // the bus checks in 150 m out at 50 km/h: about 10.8 s before the line, so longer holds are never used
    const input = parse(APPROACHES.busyCross)
    const { recommendation: rec } = recommendApproach(input, ranges({ strategies: ['green-extension'] }), NO_CITY_LIMITS, 'bus-saving')
    expect(rec.settings.maxExtensionS).toBeLessThan(12)
    expect(rec.binding).toEqual([])
    expect(rec.summary).toMatch(/No limit binds/)
  })

  it('the city’s minimum recovery holds the lockout', () => {
    const input = parse(APPROACHES.nearSide)
    const r = ranges({ stepS: 2 })
    const free = recommendApproach(input, r, NO_CITY_LIMITS, 'bus-saving').recommendation
    expect(free.settings.lockoutCycles).toBe(0)
    const rec = recommendApproach(input, r, { ...NO_CITY_LIMITS, minLockoutCycles: 2 }, 'bus-saving').recommendation
    expect(rec.settings.lockoutCycles).toBe(2)
    expect(rec.binding.some((b) => b.setting === 'lockoutCycles' && b.constraint === 'min-lockout')).toBe(true)
  })
})

describe('monotonic sanity: a looser limit never gives a worse optimum', () => {
  const input = parse(APPROACHES.busyCross)
  const r = ranges({ stepS: 2 })
  const best = (limits: CityLimits, objective: Objective) => recommendApproach(input, r, limits, objective).recommendation
  const chains: [string, CityLimits[]][] = [
    ['max v/c', [0.85, 0.86, 0.88, 0.9, 0.95, null].map((v) => ({ ...NO_CITY_LIMITS, maxCrossVc: v }))],
    ['worst LOS', (['A', 'B', 'C', 'D', 'E', 'F'] as const).map((v) => ({ ...NO_CITY_LIMITS, worstLos: v }))],
    ['max extension', [0, 2, 4, 8, 16, null].map((v) => ({ ...NO_CITY_LIMITS, maxExtensionS: v }))],
    ['max early green', [0, 2, 4, 8, 16, null].map((v) => ({ ...NO_CITY_LIMITS, maxEarlyGreenS: v }))],
    ['min lockout', [3, 2, 1, 0].map((v) => ({ ...NO_CITY_LIMITS, minLockoutCycles: v }))],
  ]
  for (const [name, chain] of chains) {
    for (const objective of ['person-delay', 'bus-saving'] as const) {
      it(`${name}, ${objective}`, () => {
        const values = chain.map((l) => best(l, objective)).map((x) => (x.feasible ? x.objectiveValue : -Infinity))
        for (let i = 1; i < values.length; i++) expect(values[i]).toBeGreaterThanOrEqual(values[i - 1] - 1e-9 * Math.max(1, Math.abs(values[i - 1])))
        // and each limit binds the bus saving somewhere along its chain on this approach
        if (objective === 'bus-saving') expect(values[values.length - 1]).toBeGreaterThan(values[0])
      })
    }
  }
})

describe('one setting for several periods', () => {
  it('keeps every limit in each period and is the best over the day', () => {
    const am = parse({ ...APPROACHES.busyCross, crossStreet: { arrivalFlowVehPerHour: 850 } })
    const pm = parse({ ...APPROACHES.busyCross, crossStreet: { arrivalFlowVehPerHour: 600 }, bus: { busesPerHour: 12 } })
    const r = ranges({ stepS: 2 })
    const limits: CityLimits = { ...NO_CITY_LIMITS, maxCrossVc: 0.87, minLockoutCycles: 1 }
    const periods = [{ label: 'Morning peak', input: am, hours: 2, trips: 60 }, { label: 'Midday', input: pm, hours: 4, trips: 48 }]
    const rec = recommendPeriods(periods, r, limits, 'person-delay')
    expect(rec.cases.map((c) => c.label)).toEqual(['Morning peak', 'Midday'])
    for (const c of rec.cases) expect(c.point.violations).toEqual([])
    // brute force over the day
    const a = sweepApproach(am, r, limits).points
    const b = sweepApproach(pm, r, limits).points
    let bestDay = -Infinity
    for (let i = 0; i < a.length; i++) {
      if (a[i].violations.length || b[i].violations.length) continue
      bestDay = Math.max(bestDay, 2 * a[i].personDelayBalanceS + 4 * b[i].personDelayBalanceS)
    }
    expect(rec.objectiveValue).toBeCloseTo(bestDay, 6)
    // the morning's v/c limit binds for the day even though midday could take more
    const midday = recommendApproach(pm, r, limits, 'person-delay').recommendation
    expect(midday.objectiveValue * 4).toBeGreaterThanOrEqual(rec.cases[1].point.personDelayBalanceS * 4 - 1e-9)
  })
})

describe('the best trade-offs', () => {
  it('keeps the points within the limits that no other beats on both figures', async () => {
    const { tradeOffFront } = await import('../../../shared/model/recommend')
    const points = sweepApproach(parse(APPROACHES.busyCross), ranges({ stepS: 2 }), { ...NO_CITY_LIMITS, maxCrossVc: 0.88 }).points
    const front = tradeOffFront(points)
    expect(front.length).toBeGreaterThan(2)
    const ok = points.filter((p) => !p.violations.length && (p.grantsPerHour > 0 || p.settings.strategy === 'none'))
    for (const f of front) {
      expect(f.violations).toEqual([])
      // nothing within the limits saves the bus more for no more cross-street delay
      expect(ok.some((p) => p.busSavingPerTripS > f.busSavingPerTripS + 1e-9 && p.crossExtraDelayPerVehS <= f.crossExtraDelayPerVehS + 1e-12)).toBe(false)
    }
    for (let i = 1; i < front.length; i++) {
      expect(front[i].busSavingPerTripS).toBeGreaterThan(front[i - 1].busSavingPerTripS)
      expect(front[i].crossExtraDelayPerVehS).toBeGreaterThanOrEqual(front[i - 1].crossExtraDelayPerVehS)
    }
    // every point within the limits is matched or beaten by one on the front
    for (const p of ok) expect(front.some((f) => f.busSavingPerTripS >= p.busSavingPerTripS - 1e-9 && f.crossExtraDelayPerVehS <= p.crossExtraDelayPerVehS + 1e-12)).toBe(true)
    // coarser steps for a table: each entry saves at least 0.05 s more than the one before
    const coarse = tradeOffFront(points, 0.05)
    expect(coarse.length).toBeLessThanOrEqual(front.length)
    for (let i = 1; i < coarse.length; i++) expect(coarse[i].busSavingPerTripS - coarse[i - 1].busSavingPerTripS).toBeGreaterThan(0.05)
  })
})

import { describe, expect, it } from 'vitest'
import { DEFAULT_PERIODS, checkPeriods } from '../../../shared/corridors/periods'
import { stopRelationProblem } from '../../../shared/corridors/approach-rules'
import { shapeLine, snapToShape } from '../../../shared/corridors/shape-line'
import { windowMinutes } from '../../../shared/signals/time-of-day'

describe('corridor periods', () => {
  it('default to the usual split of the day, covering all 24 hours without overlap (common practice)', () => {
    expect(DEFAULT_PERIODS.map((p) => p.name)).toEqual(['Early morning', 'AM peak', 'Midday', 'PM peak', 'Evening', 'Night'])
    expect(checkPeriods(DEFAULT_PERIODS)).toEqual([])
    expect(DEFAULT_PERIODS.reduce((s, p) => s + windowMinutes(p), 0)).toBe(24 * 60)
  })
  it('refuse overlaps, twin names and empty periods with their paths', () => {
    const issues = checkPeriods([
      { name: 'AM', startTime: '07:00', endTime: '09:00' },
      { name: 'Late AM', startTime: '08:30', endTime: '10:00' },
      { name: 'am', startTime: '12:00', endTime: '13:00' },
      { name: 'Empty', startTime: '14:00', endTime: '14:00' },
    ])
    expect(issues.map((i) => i.path)).toEqual([[1, 'startTime'], [2, 'name'], [3, 'endTime']])
  })
})

describe('stop relation', () => {
  it('accepts a near-side stop before the stop line and a far-side stop after it, within a block', () => {
    expect(stopRelationProblem('near-side', 950, 1000)).toBeNull()
    expect(stopRelationProblem('far-side', 1040, 1000)).toBeNull()
    expect(stopRelationProblem('near-side', 1010, 1000)).toBeNull() // within the position tolerance
    expect(stopRelationProblem('near-side', 1060, 1000)).toContain('other side')
    expect(stopRelationProblem('far-side', 1500, 1000)).toContain('too far')
    expect(stopRelationProblem('none', 0, 1000)).toBeNull()
  })
})

describe('snapToShape', () => {
  // A straight east-west shape along the equator: 0.01 degree of longitude is 1 111.95 m on the
  // IUGG mean sphere (R = 6 371 008.8 m).
  const line = shapeLine([{ lat: 0, lon: 0 }, { lat: 0, lon: 0.01 }, { lat: 0, lon: 0.02 }])
  it('gives the distance along the shape and the offset of the nearest point, in metres', () => {
    expect(line.lengthM).toBeCloseTo(2223.9, 0)
    const s = snapToShape(line, 0.0005, 0.015) // 55.6 m north of the line, three quarters along
    expect(s.distanceM).toBeCloseTo(1667.9, 0)
    expect(s.offsetM).toBeCloseTo(55.6, 0)
  })
})

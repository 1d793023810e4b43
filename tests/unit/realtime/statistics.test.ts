import { describe, expect, it } from 'vitest'
import { bootstrapChange, median, p85, quantile, seededRandom, sortNumbers } from '../../../server/services/realtime/statistics'
import { addDays, dayTypeOfIso, localDate, serviceDayStart } from '../../../server/services/realtime/service-day'

describe('quantiles (Hyndman & Fan 1996, definition 7: R and NumPy default)', () => {
  it('matches hand computation', () => {
    // Sorted 10, 20, 30, 40: median h = 3 x 0.5 = 1.5 -> 20 + 0.5 x 10 = 25.
    expect(median([40, 10, 30, 20])).toBe(25)
    // p85 of 1..10: h = 9 x 0.85 = 7.65 -> x8 + 0.65 (x9 - x8) = 8 + 0.65 = 8.65.
    expect(p85([1, 2, 3, 4, 5, 6, 7, 8, 9, 10])).toBeCloseTo(8.65, 12)
    expect(quantile(sortNumbers([7]), 0.85)).toBe(7)
    expect(Number.isNaN(median([]))).toBe(true)
  })
})

describe('seeded bootstrap of a change', () => {
  it('is reproducible with a seed and differs with another', () => {
    const r1 = seededRandom(42), r2 = seededRandom(42), r3 = seededRandom(43)
    const a = [r1(), r1(), r1()], b = [r2(), r2(), r2()], c = [r3(), r3(), r3()]
    expect(a).toEqual(b)
    expect(a).not.toEqual(c)
    for (const x of a) expect(x >= 0 && x < 1).toBe(true)
  })

  it('brackets the change of medians and reproduces exactly with the same seed', () => {
    // Before: 300..399 s, after the same minus 20 s: the change of medians is exactly -20 s
    // ((349.5 - 20) - 349.5), and the interval must contain it.
    const before = Array.from({ length: 100 }, (_, i) => 300 + i)
    const after = before.map((x) => x - 20)
    const res = bootstrapChange(before, after, 0.5, { seed: 7, resamples: 1000 })!
    expect(res.change).toBe(-20)
    expect(res.low).toBeLessThan(-20)
    expect(res.high).toBeGreaterThan(-20)
    expect(bootstrapChange(before, after, 0.5, { seed: 7, resamples: 1000 })).toEqual(res)
    // Identical constant samples: no spread at all.
    expect(bootstrapChange([5, 5, 5], [5, 5], 0.85)).toEqual({ change: 0, low: 0, high: 0 })
    expect(bootstrapChange([], [1], 0.5)).toBeNull()
  })

  it('gives a wider interval to fewer trips', () => {
    const r = seededRandom(3)
    const draw = (n: number, shift: number) => Array.from({ length: n }, () => 300 + shift + 60 * r())
    const small = bootstrapChange(draw(8, 0), draw(8, -10), 0.5, { seed: 1 })!
    const large = bootstrapChange(draw(400, 0), draw(400, -10), 0.5, { seed: 1 })!
    expect(large.high - large.low).toBeLessThan(small.high - small.low)
  })
})

describe('service day (GTFS: times count from noon minus 12 h, local time)', () => {
  it('is midnight on an ordinary day and shifts on clock-change days', () => {
    // 2024-05-06 in Europe/Amsterdam (UTC+2 in summer): local midnight = 2024-05-05T22:00:00Z.
    expect(serviceDayStart('20240506', 'Europe/Amsterdam')).toBe(Date.UTC(2024, 4, 5, 22) / 1000)
    // 2024-03-31, clocks go forward at 02:00 (UTC+1 -> UTC+2): noon is 10:00Z, minus 12 h = 2024-03-30T22:00Z,
    // one hour before local midnight (23:00Z): the GTFS reference's "noon minus 12 h" rule.
    expect(serviceDayStart('20240331', 'Europe/Amsterdam')).toBe(Date.UTC(2024, 2, 30, 22) / 1000)
    expect(serviceDayStart('20240506', 'UTC')).toBe(Date.UTC(2024, 4, 6) / 1000)
    // "25:35:00" = 92100 s after it: 01:35 the next day.
    expect(new Date((serviceDayStart('20240506', 'UTC') + 92_100) * 1000).toISOString()).toBe('2024-05-07T01:35:00.000Z')
  })

  it('names local dates and day types', () => {
    expect(localDate(Date.UTC(2024, 4, 5, 22, 30) / 1000, 'Europe/Amsterdam')).toBe('20240506')
    expect(dayTypeOfIso('2024-05-06')).toBe('weekday')
    expect(dayTypeOfIso('2024-05-11')).toBe('saturday')
    expect(dayTypeOfIso('2024-05-12')).toBe('sunday')
    expect(addDays('20240301', -1)).toBe('20240229')
  })
})

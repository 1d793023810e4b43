import { describe, expect, it } from 'vitest'
import { buildDigest, crossingTimes, decodePeriod, periodIndexAt } from '../../../shared/savings/schedule-digest'
import type { CorridorRun } from '../../../shared/corridors/schedule'

const hms = (h: number, m: number, s = 0) => h * 3600 + m * 60 + s
// Three corridor stops at 0, 600 and 1100 m along the shape.
const STOPS_M = [0, 600, 1100]
const run: CorridorRun = {
  tripId: 'T1', routeId: '7', serviceId: 'WK', shiftS: 0,
  passes: [
    { stop: 0, arrivalS: hms(7, 0), departureS: hms(7, 0) },
    { stop: 1, arrivalS: hms(7, 2), departureS: hms(7, 2, 20) },
    { stop: 2, arrivalS: hms(7, 4), departureS: hms(7, 4) },
  ],
}
const PERIODS = [
  { id: 'am', name: 'AM peak', startTime: '07:00', endTime: '07:03' },
  { id: 'rest', name: 'Rest', startTime: '07:03', endTime: '07:00' },
]

describe('when a trip crosses each intersection', () => {
  it('interpolates along the shape between the stop times either side', () => {
    // Hand-checked: 300 m is half-way from 0 to 600 m, driven 07:00:00 -> 07:02:00: 07:01:00.
    // At 600 m the bus is at the stop: it leaves at 07:02:20. At 850 m, half-way from 600 to
    // 1100 m, driven 07:02:20 -> 07:04:00: 07:03:10. Beyond the last stop: not crossed.
    expect(crossingTimes(run, STOPS_M, [300, 600, 850, 1200])).toEqual([hms(7, 1), hms(7, 2, 20), hms(7, 3, 10), null])
  })

  it('adds the shift of a frequency-based run', () => {
    expect(crossingTimes({ ...run, shiftS: 600 }, STOPS_M, [300])).toEqual([hms(7, 11)])
  })

  it('puts each crossing in its period, past midnight too', () => {
    expect(periodIndexAt(PERIODS, hms(7, 1))).toBe(0)
    expect(periodIndexAt(PERIODS, hms(7, 3, 10))).toBe(1)
    expect(periodIndexAt(PERIODS, hms(25, 0))).toBe(1)
    expect(periodIndexAt([PERIODS[0]], hms(9, 0))).toBe(-1)
  })

  it('digests the runs: entry, exit and the period of every crossing', () => {
    const digest = buildDigest({
      feedId: 1, directionId: 0, runs: [run], stopDistancesM: STOPS_M,
      approaches: [{ id: 'a', distanceM: 300 }, { id: 'b', distanceM: 850 }, { id: 'c', distanceM: 1200 }],
      periods: PERIODS,
      trips: [{ routeId: '7', directionId: 1, serviceId: 'WK', startS: hms(7, 10), endS: hms(7, 25) }],
      serviceDates: new Map([['WK', [1, 2]]]), feedRange: { startDay: 1, endDay: 2 },
    })
    expect(digest.runs).toEqual([[0, 0, hms(7, 0), hms(7, 4), '01.']])
    expect([...digest.runs[0][4]].map(decodePeriod)).toEqual([0, 1, -1])
    expect(digest.trips).toEqual([[0, 1, 0, hms(7, 10), 900]])
    expect(digest.serviceDates).toEqual({ WK: [1, 2] })
  })
})

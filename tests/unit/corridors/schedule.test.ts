import { describe, expect, it } from 'vitest'
import { hourlyTrips, median, runTimesBetweenStops, timeAtDistance, tripsByPeriod, type CorridorRun } from '../../../shared/corridors/schedule'
import { dayTypeOf, daysOfType, serviceShare } from '../../../shared/corridors/day-types'
import { parseGtfsDate } from '../../../shared/gtfs/date'
import { windowMinutes } from '../../../shared/signals/time-of-day'

// Three corridor stops at 0, 400 and 1000 m. Times in GTFS seconds (07:00:00 = 25 200).
const at = (h: number, m: number, s = 0) => h * 3600 + m * 60 + s
const run = (tripId: string, serviceId: string, start: number, legs: number[], shiftS = 0, from = 0): CorridorRun => {
  const passes = [{ stop: from, arrivalS: start, departureS: start }]
  let t = start
  legs.forEach((leg, i) => { t += leg; passes.push({ stop: from + i + 1, arrivalS: t, departureS: t + 20 }); t += 20 })
  return { tripId, routeId: '7', serviceId, shiftS, passes }
}

describe('runTimesBetweenStops', () => {
  it('takes the median over the runs that serve both stops', () => {
    const runs = [run('a', 'WK', at(7, 0), [60, 90]), run('b', 'WK', at(7, 10), [70, 100]), run('c', 'WK', at(7, 20), [200, 80]), run('d', 'WK', at(7, 30), [50], 0, 1)]
    // Stop 0 -> 1: 60, 70, 200 s -> 70 s. Stop 1 -> 2: 90, 100, 80 and 50 s -> (80 + 90) / 2 = 85 s.
    expect(runTimesBetweenStops(runs, 3)).toEqual([
      { fromStop: 0, toStop: 1, medianS: 70, trips: 3 },
      { fromStop: 1, toStop: 2, medianS: 85, trips: 4 },
    ])
  })
  it('skips a pair that an express run passes without stopping', () => {
    const express: CorridorRun = { tripId: 'x', routeId: '17', serviceId: 'WK', shiftS: 0, passes: [{ stop: 0, arrivalS: 0, departureS: 0 }, { stop: 2, arrivalS: 120, departureS: 120 }] }
    expect(runTimesBetweenStops([express], 3).map((r) => r.trips)).toEqual([0, 0])
    expect(median([])).toBeNull()
    expect(median([3, 1, 2])).toBe(2)
  })
})

describe('day types and service shares', () => {
  // 2025-03-03 is a Monday; the week to Sunday 2025-03-09 has 5 weekdays, 1 Saturday, 1 Sunday.
  const mon = parseGtfsDate('20250303')!
  it('classify days and count them in a range', () => {
    expect([0, 1, 2, 3, 4, 5, 6].map((i) => dayTypeOf(mon + i))).toEqual(['weekday', 'weekday', 'weekday', 'weekday', 'weekday', 'saturday', 'sunday'])
    expect(daysOfType(mon, mon + 13)).toEqual({ weekday: 10, saturday: 2, sunday: 2 })
  })
  it('give the share of days of each type a service runs, holidays included', () => {
    const range = daysOfType(mon, mon + 13)
    // Weekdays of two weeks less one holiday, plus one Saturday.
    const days = [0, 1, 2, 3, 4, 7, 8, 9, 10, 5].map((i) => mon + i)
    expect(serviceShare(days, range, mon, mon + 13)).toEqual({ weekday: 0.9, saturday: 0.5, sunday: 0 })
  })
})

describe('tripsByPeriod and hourlyTrips', () => {
  const periods = [
    { id: 'am', startTime: '07:00', endTime: '09:00' },
    { id: 'night', startTime: '22:00', endTime: '05:00' },
  ].map((p) => ({ ...p, minutes: windowMinutes(p) }))
  const share = (id: string) => (id === 'WK' ? { weekday: 1, saturday: 0, sunday: 0 } : { weekday: 0, saturday: 1, sunday: 1 })

  it('counts each run in the period of its corridor entry, weighted by its day types, per hour of the period', () => {
    const runs = [
      // A frequency-based template at 07:00 run every 15 min from 07:00 to 09:00 gives 8 runs.
      ...[0, 1, 2, 3, 4, 5, 6, 7].map((k) => run('f', 'WK', at(7, 0), [60, 60], k * 900)),
      run('late', 'WE', at(25, 10), [60]), // 01:10 the next morning: night
      run('noon', 'WK', at(12, 0), [60]), // in no period
    ]
    const t = tripsByPeriod(runs, share, periods)
    expect(t.find((x) => x.periodId === 'am' && x.dayType === 'weekday')).toMatchObject({ tripsPerDay: 8, tripsPerHour: 4 })
    expect(t.find((x) => x.periodId === 'am' && x.dayType === 'saturday')).toMatchObject({ tripsPerDay: 0 })
    expect(t.find((x) => x.periodId === 'night' && x.dayType === 'sunday')).toMatchObject({ tripsPerDay: 1, tripsPerHour: 1 / 7 })
    const hourly = hourlyTrips(runs, share)
    expect(hourly.weekday[7]).toBe(4)
    expect(hourly.weekday[8]).toBe(4)
    expect(hourly.weekday[12]).toBe(1)
    expect(hourly.saturday[1]).toBe(1)
  })
})

describe('timeAtDistance', () => {
  it('interpolates between the departure from one stop and the arrival at the next, shift included', () => {
    const r = run('a', 'WK', at(7, 0), [60, 90], 600)
    const dist = [0, 400, 1000]
    expect(timeAtDistance(r, dist, 200)).toBe(at(7, 0) + 30 + 600)
    // Leaves stop 1 at 07:01:20, reaches stop 2 at 07:02:50: 900 m is 5/6 of the way.
    expect(timeAtDistance(r, dist, 900)).toBe(at(7, 1, 20) + 75 + 600)
    expect(timeAtDistance(r, dist, 1200)).toBeNull()
  })
})

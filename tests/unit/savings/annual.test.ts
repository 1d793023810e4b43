import { describe, expect, it } from 'vitest'
import { annualWindow, averageDayShares, serviceYear } from '../../../shared/savings/annual'
import { serviceDates } from '../../../shared/gtfs/service-dates'
import { dayOfIso, isoDate, parseGtfsDate } from '../../../shared/gtfs/date'

const g = (s: string) => parseGtfsDate(s)!
const WEEKDAYS = [true, true, true, true, true, false, false]
const SATURDAYS = [false, false, false, false, false, true, false]
const SUNDAYS = [false, false, false, false, false, false, true]

describe('the 12 months from a reference date', () => {
  it('ends the day before the same date a year later', () => {
    const w = annualWindow(dayOfIso('2027-01-01'))
    expect([isoDate(w.fromDay), isoDate(w.toDay)]).toEqual(['2027-01-01', '2027-12-31'])
    const leap = annualWindow(dayOfIso('2028-01-01'))
    expect(leap.toDay - leap.fromDay + 1).toBe(366)
  })
})

describe('annual service days from a calendar with exceptions', () => {
  // calendar.txt and calendar_dates.txt as the GTFS Schedule reference defines them
  // (exception_type 1 = added, 2 = removed). Counted by hand: 2027 starts on a Friday, so its
  // 365 days are 52 whole weeks (260 weekdays, 52 Saturdays, 52 Sundays) plus Friday 31 December.
  const dates = serviceDates(
    [
      { serviceId: 'WK', days: WEEKDAYS, startDay: g('20261201'), endDay: g('20280131') },
      { serviceId: 'SA', days: SATURDAYS, startDay: g('20261201'), endDay: g('20280131') },
    ],
    [
      { serviceId: 'WK', day: g('20261225'), exceptionType: 2 }, // before the 12 months: not counted
      { serviceId: 'WK', day: g('20270101'), exceptionType: 2 }, // New Year's Day, a Friday
      { serviceId: 'WK', day: g('20271227'), exceptionType: 2 }, // a Monday
      { serviceId: 'WK', day: g('20270306'), exceptionType: 1 }, // a Saturday run as a weekday
      { serviceId: 'SA', day: g('20270306'), exceptionType: 2 },
    ],
  )

  it('counts the real dates when the feed covers the whole 12 months', () => {
    const y = serviceYear(dates, { startDay: g('20261201'), endDay: g('20280131') }, dayOfIso('2027-01-01'))
    expect(y.basis).toBe('calendar')
    expect(y.daysOfType).toEqual({ weekday: 261, saturday: 52, sunday: 52 })
    // 261 weekdays less the two removed; the added Saturday counts as a Saturday.
    expect(y.perService.get('WK')).toEqual({ weekday: 259, saturday: 1, sunday: 0 })
    expect(y.perService.get('SA')).toEqual({ weekday: 0, saturday: 51, sunday: 0 })
    expect(y.note).toContain('2027-01-01 to 2027-12-31')
  })

  it('scales the feed’s range by day type when the feed covers less, and says so', () => {
    // Two weeks from Monday 2026-01-05: 10 weekdays, 2 Saturdays, 2 Sundays. WK loses Tuesday
    // 2026-01-06, which SU runs instead: WK 9 weekdays x 261/10 = 234.9; SU 2 Sundays x 52/2 = 52
    // and 1 weekday x 26.1 (hand-checked).
    const two = serviceDates(
      [
        { serviceId: 'WK', days: WEEKDAYS, startDay: g('20260105'), endDay: g('20260118') },
        { serviceId: 'SU', days: SUNDAYS, startDay: g('20260105'), endDay: g('20260118') },
      ],
      [{ serviceId: 'WK', day: g('20260106'), exceptionType: 2 }, { serviceId: 'SU', day: g('20260106'), exceptionType: 1 }],
    )
    const y = serviceYear(two, { startDay: g('20260105'), endDay: g('20260118') }, dayOfIso('2027-01-01'))
    expect(y.basis).toBe('scaled')
    expect(y.scale).toEqual({ weekday: 26.1, saturday: 26, sunday: 26 })
    expect(y.perService.get('WK')!.weekday).toBeCloseTo(234.9, 10)
    expect(y.perService.get('SU')!.weekday).toBeCloseTo(26.1, 10)
    expect(y.perService.get('SU')!.sunday).toBe(52)
    expect(y.note).toMatch(/covers 2026-01-05 to 2026-01-18 only/)
    expect(y.note).toMatch(/261 weekdays in the year over 10 in the feed/)
  })

  it('counts a day type the short range lacks as no service, and says so', () => {
    const y = serviceYear(dates, { startDay: g('20270104'), endDay: g('20270108') }, dayOfIso('2027-01-01'))
    expect(y.basis).toBe('scaled')
    expect(y.perService.get('SA')).toEqual({ weekday: 0, saturday: 0, sunday: 0 })
    expect(y.note).toMatch(/no saturday or sunday/)
  })

  it('gives the share of average days a service runs within the feed’s range', () => {
    const s = averageDayShares(dates, { startDay: g('20270101'), endDay: g('20271231') })
    expect(s.get('WK')!.weekday).toBeCloseTo(259 / 261, 12)
    expect(s.get('WK')!.saturday).toBeCloseTo(1 / 52, 12)
  })
})

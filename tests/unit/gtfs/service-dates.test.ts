import { describe, expect, it } from 'vitest'
import { serviceDates } from '../../../shared/gtfs/service-dates'
import { isoDate, parseGtfsDate } from '../../../shared/gtfs/date'

const d = (s: string) => parseGtfsDate(s)!
const weekdays = [true, true, true, true, true, false, false]

// GTFS Schedule reference, calendar_dates.txt: exception_type 1 adds the date, 2 removes it.
describe('serviceDates', () => {
  it('applies the weekly pattern between start and end dates, both included', () => {
    const out = serviceDates([{ serviceId: 'WK', days: weekdays, startDay: d('20260105'), endDay: d('20260116') }], [])
    expect(out.get('WK')!.map(isoDate)).toEqual([
      '2026-01-05', '2026-01-06', '2026-01-07', '2026-01-08', '2026-01-09',
      '2026-01-12', '2026-01-13', '2026-01-14', '2026-01-15', '2026-01-16',
    ])
  })

  it('removes and adds dates by exception, and accepts services defined by exceptions alone', () => {
    const out = serviceDates(
      [{ serviceId: 'WK', days: weekdays, startDay: d('20260105'), endDay: d('20260109') }],
      [
        { serviceId: 'WK', day: d('20260106'), exceptionType: 2 },
        { serviceId: 'WK', day: d('20260110'), exceptionType: 1 },
        { serviceId: 'WK', day: d('20260111'), exceptionType: 2 }, // removing a date it never had
        { serviceId: 'HOL', day: d('20260101'), exceptionType: 1 },
      ],
    )
    expect(out.get('WK')!.map(isoDate)).toEqual(['2026-01-05', '2026-01-07', '2026-01-08', '2026-01-09', '2026-01-10'])
    expect(out.get('HOL')!.map(isoDate)).toEqual(['2026-01-01'])
  })

  it('keeps a service whose every date is removed, with no dates', () => {
    const out = serviceDates(
      [{ serviceId: 'SAT', days: [false, false, false, false, false, true, false], startDay: d('20260105'), endDay: d('20260111') }],
      [{ serviceId: 'SAT', day: d('20260110'), exceptionType: 2 }],
    )
    expect(out.get('SAT')).toEqual([])
  })
})

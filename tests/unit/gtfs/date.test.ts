import { describe, expect, it } from 'vitest'
import { dayOfIso, gtfsDate, isoDate, parseGtfsDate, weekdayIndex } from '../../../shared/gtfs/date'

// GTFS Schedule reference: service dates are YYYYMMDD.
describe('GTFS dates', () => {
  it('reads real dates and refuses the rest', () => {
    expect(isoDate(parseGtfsDate('20190301')!)).toBe('2019-03-01')
    expect(parseGtfsDate('20240229')).not.toBeNull()
    for (const bad of ['20230229', '20190230', '20191301', '20190100', '2019031', '2019-03-01', '', 'abcdefgh']) {
      expect(parseGtfsDate(bad), bad).toBeNull()
    }
  })

  it('round-trips day numbers', () => {
    expect(parseGtfsDate('19700101')).toBe(0)
    expect(gtfsDate(parseGtfsDate('20261231')!)).toBe('20261231')
    expect(dayOfIso('2026-12-31')).toBe(parseGtfsDate('20261231'))
  })

  it('gives the weekday in calendar.txt column order (Monday = 0)', () => {
    expect(weekdayIndex(parseGtfsDate('19700101')!)).toBe(3) // a Thursday
    expect(weekdayIndex(parseGtfsDate('20190301')!)).toBe(4) // a Friday
    expect(weekdayIndex(parseGtfsDate('20190303')!)).toBe(6) // a Sunday
    expect(weekdayIndex(parseGtfsDate('19691229')!)).toBe(0) // a Monday before day 0
  })
})

// calendar.txt and calendar_dates.txt, and the active dates of every service derived from them.
import { parseGtfsDate } from '../../../shared/gtfs/date'
import { serviceDates } from '../../../shared/gtfs/service-dates'
import type { FeedState } from './feed-state'
import { readGtfsFile, type ReadContext, type ReadOutcome } from './read-file'
import type { ZipEntry } from './zip'

const DAYS = ['monday', 'tuesday', 'wednesday', 'thursday', 'friday', 'saturday', 'sunday'] as const

export async function readCalendar(st: FeedState, ctx: ReadContext, entry: ZipEntry): Promise<ReadOutcome> {
  const file = 'calendar.txt'
  const w = st.writers.gtfs_calendar
  const seen = new Set<string>()
  return readGtfsFile(ctx, file, entry, (r, line) => {
    if (seen.has(r.service_id)) {
      st.findings.error('duplicate_key', { file, line, field: 'service_id', value: r.service_id, message: `The service_id ${r.service_id} has two lines in calendar.txt.` })
      return
    }
    const start = parseGtfsDate(r.start_date)!, end = parseGtfsDate(r.end_date)!
    if (end < start) {
      st.findings.error('date_order', { file, line, field: 'end_date', value: r.end_date, message: `end_date is before start_date ${r.start_date}.` })
      return
    }
    seen.add(r.service_id)
    st.calendarServices.add(r.service_id)
    const days = DAYS.map((d) => r[d] === '1')
    st.calendarRules.push({ serviceId: r.service_id, days, startDay: start, endDay: end })
    w.row(11).int(st.feedId).text(r.service_id)
    for (const d of days) w.bool(d)
    w.date(start).date(end)
  })
}

export async function readCalendarDates(st: FeedState, ctx: ReadContext, entry: ZipEntry): Promise<ReadOutcome> {
  const file = 'calendar_dates.txt'
  const w = st.writers.gtfs_calendar_dates
  const seen = new Set<string>()
  return readGtfsFile(ctx, file, entry, (r, line) => {
    const key = `${r.service_id}\u0000${r.date}`
    if (seen.has(key)) {
      st.findings.error('duplicate_key', { file, line, field: 'date', value: r.date, message: `The service_id ${r.service_id} has two lines for ${r.date}.` })
      return
    }
    seen.add(key)
    const day = parseGtfsDate(r.date)!
    st.calendarServices.add(r.service_id)
    st.calendarExceptions.push({ serviceId: r.service_id, day, exceptionType: r.exception_type === '1' ? 1 : 2 })
    w.row(4).int(st.feedId).text(r.service_id).date(day).small(Number(r.exception_type))
  })
}

/** gtfs_service_dates, the feed's service range over the services trips use, and warnings. */
export function writeServiceDates(st: FeedState) {
  const dates = serviceDates(st.calendarRules, st.calendarExceptions)
  const w = st.writers.gtfs_service_dates
  for (const [service, days] of dates) {
    if (days.length === 0) {
      st.findings.warning('service_without_dates', { file: 'calendar.txt', line: null, field: 'service_id', value: service, message: `The service ${service} is active on no date.` })
    }
    const sid = Buffer.from(service)
    for (const d of days) w.row(3).int(st.feedId).bytes(sid).date(d)
    if (st.usedServices.has(service) && days.length) {
      if (st.serviceStart === null || days[0] < st.serviceStart) st.serviceStart = days[0]
      if (st.serviceEnd === null || days[days.length - 1] > st.serviceEnd) st.serviceEnd = days[days.length - 1]
    }
  }
  st.serviceDateRows = w.rows
}

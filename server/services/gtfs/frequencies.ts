// frequencies.txt, and the trips it describes (gtfs_frequency_trips): one row per start, with the
// shift that moves the template trip's stop times onto it.
import { frequencyStartTimes } from '../../../shared/gtfs/frequencies'
import { formatGtfsTime, parseGtfsTime } from '../../../shared/gtfs/time'
import type { FeedState } from './feed-state'
import { readGtfsFile, type ReadContext, type ReadOutcome } from './read-file'
import type { ZipEntry } from './zip'

export async function readFrequencies(st: FeedState, ctx: ReadContext, entry: ZipEntry): Promise<ReadOutcome> {
  const file = 'frequencies.txt'
  const f = st.findings
  const w = st.writers.gtfs_frequencies
  const expanded = st.writers.gtfs_frequency_trips
  const windows = new Map<number, { start: number; end: number; line: number }[]>()
  const out = await readGtfsFile(ctx, file, entry, (r, line) => {
    const trip = st.tripIndex.get(r.trip_id)
    if (trip === undefined) {
      f.error('dangling_reference', { file, line, field: 'trip_id', value: r.trip_id, message: `No trip in trips.txt has the trip_id ${r.trip_id}.` })
      return
    }
    const start = parseGtfsTime(r.start_time)!, end = parseGtfsTime(r.end_time)!, headway = Number(r.headway_secs)
    if (end <= start) {
      f.error('time_order', { file, line, field: 'end_time', value: r.end_time, message: `end_time must be after start_time ${r.start_time}.` })
      return
    }
    const list = windows.get(trip) ?? []
    if (list.some((x) => x.start === start)) {
      f.error('duplicate_key', { file, line, field: 'start_time', value: r.start_time, message: `The trip ${r.trip_id} has two windows starting at ${r.start_time}.` })
      return
    }
    list.push({ start, end, line })
    windows.set(trip, list)
    const first = st.tripFirstDeparture[trip]
    if (st.tripStopTimes[trip] === 0 || first < 0) {
      f.error('missing_stop_times', { file, line, field: 'trip_id', value: r.trip_id, message: `The trip ${r.trip_id} has no usable stop_times to repeat.` })
      return
    }
    const exact = r.exact_times === '1' ? 1 : 0
    w.row(6).int(st.feedId).bytes(st.tripBytes[trip]).int(start).int(end).int(headway).small(exact)
    for (const t of frequencyStartTimes({ startS: start, endS: end, headwayS: headway })) {
      expanded.row(6).int(st.feedId).bytes(st.tripBytes[trip]).int(t).int(t - first).int(headway).bool(exact === 1)
    }
  })
  for (const [trip, list] of windows) {
    list.sort((a, b) => a.start - b.start)
    for (let k = 1; k < list.length; k++) {
      if (list[k].start < list[k - 1].end) {
        f.warning('frequency_overlap', { file, line: list[k].line, field: 'start_time', value: formatGtfsTime(list[k].start), message: `The windows of the trip ${st.tripIds[trip]} overlap.` })
      }
    }
  }
  st.frequencyTripRows = expanded.rows
  return out
}

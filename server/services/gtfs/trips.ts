// trips.txt: each trip's route, service and shape must exist.
import type { FeedState } from './feed-state'
import { readGtfsFile, type ReadContext, type ReadOutcome } from './read-file'
import type { ZipEntry } from './zip'

export async function readTrips(st: FeedState, ctx: ReadContext, entry: ZipEntry): Promise<ReadOutcome> {
  const file = 'trips.txt'
  const w = st.writers.gtfs_trips
  const f = st.findings
  const out = await readGtfsFile(ctx, file, entry, (r, line) => {
    if (st.tripIndex.has(r.trip_id)) {
      f.error('duplicate_key', { file, line, field: 'trip_id', value: r.trip_id, message: `The trip_id ${r.trip_id} is defined twice.` })
      return
    }
    const route = st.routeIndex.get(r.route_id)
    let ok = true
    if (route === undefined) {
      f.error('dangling_reference', { file, line, field: 'route_id', value: r.route_id, message: `No route in routes.txt has the route_id ${r.route_id}.` })
      ok = false
    }
    if (!st.calendarServices.has(r.service_id)) {
      f.error('dangling_reference', { file, line, field: 'service_id', value: r.service_id, message: `The service_id ${r.service_id} is in neither calendar.txt nor calendar_dates.txt.` })
      ok = false
    }
    const shape = r.shape_id === '' ? null : st.shapes.get(r.shape_id) ?? null
    if (r.shape_id !== '' && !shape) {
      f.error('dangling_reference', { file, line, field: 'shape_id', value: r.shape_id, message: `No shape in shapes.txt has the shape_id ${r.shape_id}.` })
      ok = false
    }
    if (!ok) return
    st.routeUsed[route!] = true
    st.usedServices.add(r.service_id)
    if (shape) st.shapeUsed.add(shape.id)
    st.tripIndex.set(r.trip_id, st.tripIds.length)
    st.tripIds.push(r.trip_id)
    st.tripBytes.push(Buffer.from(r.trip_id))
    st.tripShape.push(shape)
    st.tripRoute.push(route!)
    st.tripDirection.push(r.direction_id === '' ? -1 : Number(r.direction_id))
    const n = (s: string) => (s === '' ? null : Number(s))
    w.row(11).int(st.feedId).text(r.trip_id).text(r.route_id).text(r.service_id).text(r.trip_headsign).text(r.trip_short_name)
      .small(n(r.direction_id)).text(r.block_id).text(r.shape_id).small(n(r.wheelchair_accessible)).small(n(r.bikes_allowed))
  })
  st.tripStopTimes = new Int32Array(st.tripIds.length)
  st.tripFirstDeparture = new Int32Array(st.tripIds.length).fill(-1)
  st.tripSegment = new Float64Array(2 * st.tripIds.length)
  return out
}

// stop_times.txt, the big file (a million rows and more for a large agency). Rows are checked as
// they stream and gathered per trip; each trip is finished when the next one starts: sorted by
// stop_sequence, its order and times checked, distances along its shape found, blank times
// interpolated, and its rows written for COPY. Memory holds one trip at a time. A file that does
// not keep each trip's rows together (rare; GTFS allows it) is read a second time, keeping every
// row in compact columns and finishing the trips at the end.
import { haversineM, projectOntoPolyline } from '../../../shared/gtfs/geo'
import { interpolateStopTimes } from '../../../shared/gtfs/interpolate'
import { formatGtfsTime, parseGtfsTime } from '../../../shared/gtfs/time'
import type { FeedState, ShapeGeometry } from './feed-state'
import { readGtfsFile, type ReadContext, type ReadOutcome } from './read-file'
import type { ZipEntry } from './zip'

const FILE = 'stop_times.txt'
/** A stop this far from its trip's shape is probably misplaced. */
const FAR_FROM_SHAPE_M = 150

class Ungrouped extends Error {}

/** Rows in columns: typed arrays that grow, a sparse list for the rare headsign. */
class Rows {
  n = 0
  trip = new Int32Array(256)
  stop = new Int32Array(256)
  seq = new Int32Array(256)
  arr = new Int32Array(256)
  dep = new Int32Array(256)
  line = new Int32Array(256)
  pickup = new Int8Array(256)
  drop = new Int8Array(256)
  tp = new Int8Array(256)
  given = new Float64Array(256)
  headsign = new Map<number, string>()

  push(trip: number, stop: number, seq: number, arr: number, dep: number, line: number, pickup: number, drop: number, tp: number, given: number, headsign: string) {
    if (this.n === this.trip.length) this.grow()
    const i = this.n++
    this.trip[i] = trip; this.stop[i] = stop; this.seq[i] = seq; this.arr[i] = arr; this.dep[i] = dep; this.line[i] = line
    this.pickup[i] = pickup; this.drop[i] = drop; this.tp[i] = tp; this.given[i] = given
    if (headsign !== '') this.headsign.set(i, headsign)
  }

  clear() { this.n = 0; this.headsign.clear() }

  private grow() {
    const g = <T extends Int32Array | Int8Array | Float64Array>(a: T): T => {
      const b = new (a.constructor as new (n: number) => T)(a.length * 2)
      b.set(a)
      return b
    }
    this.trip = g(this.trip); this.stop = g(this.stop); this.seq = g(this.seq); this.arr = g(this.arr); this.dep = g(this.dep)
    this.line = g(this.line); this.pickup = g(this.pickup); this.drop = g(this.drop); this.tp = g(this.tp); this.given = g(this.given)
  }
}

const small = (s: string) => (s === '' ? -1 : Number(s))

export async function readStopTimes(st: FeedState, ctx: ReadContext, entry: ZipEntry): Promise<ReadOutcome> {
  const checkpoint = st.findings.checkpoint()
  try {
    return await pass(st, ctx, entry, true)
  } catch (err) {
    if (!(err instanceof Ungrouped)) throw err
  }
  st.findings.restore(checkpoint)
  st.writers.gtfs_stop_times.reset()
  st.tripStopTimes.fill(0)
  st.tripFirstDeparture.fill(-1)
  st.tripSegment.fill(0)
  st.interpolatedStopTimes = 0
  return pass(st, ctx, entry, false)
}

async function pass(st: FeedState, ctx: ReadContext, entry: ZipEntry, streaming: boolean): Promise<ReadOutcome> {
  const f = st.findings
  const rows = new Rows()
  const finisher = new TripFinisher(st)
  let current = -1
  const out = await readGtfsFile(ctx, FILE, entry, (r, line) => {
    const trip = st.tripIndex.get(r.trip_id)
    const stop = st.stopIndex.get(r.stop_id)
    if (trip === undefined) {
      f.error('dangling_reference', { file: FILE, line, field: 'trip_id', value: r.trip_id, message: `No trip in trips.txt has the trip_id ${r.trip_id}.` })
      return
    }
    if (stop === undefined) {
      f.error('dangling_reference', { file: FILE, line, field: 'stop_id', value: r.stop_id, message: `No stop in stops.txt has the stop_id ${r.stop_id}.` })
      return
    }
    if (streaming && trip !== current) {
      if (current >= 0) { finisher.finish(rows, identity(rows.n), current); rows.clear() }
      if (st.tripStopTimes[trip] > 0) throw new Ungrouped()
      current = trip
    }
    const arr = r.arrival_time === '' ? -1 : parseGtfsTime(r.arrival_time)!
    const dep = r.departure_time === '' ? -1 : parseGtfsTime(r.departure_time)!
    const tp = small(r.timepoint)
    if (tp === 1 && (arr < 0 || dep < 0)) {
      f.error('missing_time', { file: FILE, line, field: arr < 0 ? 'arrival_time' : 'departure_time', value: '', message: 'A timepoint (timepoint 1) needs its arrival_time and departure_time.' })
    }
    if (st.stopType[stop] !== 0) {
      f.warning('stop_type', { file: FILE, line, field: 'stop_id', value: r.stop_id, message: `Trips should serve stops or platforms (location_type 0); ${r.stop_id} has location_type ${st.stopType[stop]}.` })
    }
    st.stopUsed[stop] = 1
    rows.push(trip, stop, Number(r.stop_sequence), arr, dep, line, small(r.pickup_type), small(r.drop_off_type), tp,
      r.shape_dist_traveled === '' ? NaN : Number(r.shape_dist_traveled), r.stop_headsign)
  })
  if (streaming) {
    if (current >= 0 && rows.n) finisher.finish(rows, identity(rows.n), current)
  } else {
    // Counting sort of the row indexes by trip, then each trip on its own.
    const counts = new Int32Array(st.tripIds.length + 1)
    for (let i = 0; i < rows.n; i++) counts[rows.trip[i] + 1]++
    for (let t = 1; t < counts.length; t++) counts[t] += counts[t - 1]
    const order = new Int32Array(rows.n)
    const next = counts.slice(0, st.tripIds.length)
    for (let i = 0; i < rows.n; i++) order[next[rows.trip[i]]++] = i
    for (let t = 0; t < st.tripIds.length; t++) {
      if (counts[t + 1] > counts[t]) finisher.finish(rows, order.subarray(counts[t], counts[t + 1]), t)
    }
  }
  return out
}

function identity(n: number): Int32Array {
  const a = new Int32Array(n)
  for (let i = 0; i < n; i++) a[i] = i
  return a
}

class TripFinisher {
  private readonly patterns = new Map<string, Float64Array>()
  constructor(private readonly st: FeedState) {}

  /** Checks, measures, interpolates and writes the rows `idx` (indexes into `rows`) of one trip. */
  finish(rows: Rows, idx: Int32Array, trip: number) {
    const st = this.st
    const f = st.findings
    const n = idx.length
    let sorted = true
    for (let k = 1; k < n; k++) if (rows.seq[idx[k]] < rows.seq[idx[k - 1]]) { sorted = false; break }
    if (!sorted) idx = Int32Array.from(idx).sort((a, b) => rows.seq[a] - rows.seq[b])
    st.tripStopTimes[trip] = n
    const tripId = st.tripIds[trip]
    let ok = true
    for (let k = 1; k < n; k++) {
      if (rows.seq[idx[k]] === rows.seq[idx[k - 1]]) {
        f.error('stop_sequence', { file: FILE, line: rows.line[idx[k]], field: 'stop_sequence', value: String(rows.seq[idx[k]]), message: `The trip ${tripId} has two stops with this stop_sequence; it must increase along the trip.` })
        ok = false
      }
    }
    for (const k of [0, n - 1]) {
      const i = idx[k]
      if (rows.arr[i] < 0 && rows.dep[i] < 0) {
        f.error('missing_time', { file: FILE, line: rows.line[i], field: 'arrival_time', value: '', message: `The ${k === 0 ? 'first' : 'last'} stop of the trip ${tripId} needs an arrival_time and a departure_time.` })
        ok = false
      }
    }
    if (!ok) return
    const arr = new Float64Array(n), dep = new Float64Array(n)
    for (let k = 0; k < n; k++) {
      const i = idx[k]
      arr[k] = rows.arr[i] < 0 ? NaN : rows.arr[i]
      dep[k] = rows.dep[i] < 0 ? NaN : rows.dep[i]
    }
    let lastDep = -1, lastK = -1
    for (let k = 0; k < n; k++) {
      const i = idx[k]
      const a = Number.isNaN(arr[k]) ? dep[k] : arr[k]
      const d = Number.isNaN(dep[k]) ? arr[k] : dep[k]
      if (Number.isNaN(a)) continue
      if (d < a) {
        f.error('time_order', { file: FILE, line: rows.line[i], field: 'departure_time', value: formatGtfsTime(d), message: `departure_time is before arrival_time ${formatGtfsTime(a)}.` })
        ok = false
      }
      if (lastK >= 0 && a < lastDep) {
        f.error('time_order', { file: FILE, line: rows.line[i], field: 'arrival_time', value: formatGtfsTime(a), message: `Times must not decrease along the trip ${tripId}: the previous stop (stop_sequence ${rows.seq[idx[lastK]]}) departs at ${formatGtfsTime(lastDep)}.` })
        ok = false
      }
      lastDep = d
      lastK = k
    }
    const distM = this.distances(rows, idx, trip)
    if (!ok || distM === null) return
    let interpolated: boolean[] | null = null
    for (let k = 0; k < n; k++) if (Number.isNaN(arr[k]) || Number.isNaN(dep[k])) { interpolated = interpolateStopTimes(arr, dep, distM); break }
    st.tripFirstDeparture[trip] = dep[0]
    const w = st.writers.gtfs_stop_times
    const tripBytes = st.tripBytes[trip]
    st.tripSegment[2 * trip] = w.offset
    for (let k = 0; k < n; k++) {
      const i = idx[k]
      const interp = interpolated !== null && interpolated[k]
      if (interp) st.interpolatedStopTimes++
      w.row(13).int(st.feedId).bytes(tripBytes).int(rows.seq[i]).bytes(st.stopBytes[rows.stop[i]]).int(arr[k]).int(dep[k]).bool(interp)
        .text(rows.headsign.get(i)).small(rows.pickup[i]).small(rows.drop[i]).small(rows.tp[i]).float(rows.given[i]).float(Math.round(distM[k] * 10) / 10)
    }
    st.tripSegment[2 * trip + 1] = w.offset
  }

  /** Metres along the trip at each stop, or null after reporting distances that go backwards. */
  private distances(rows: Rows, idx: Int32Array, trip: number): Float64Array | null {
    const st = this.st
    const n = idx.length
    const shape = st.tripShape[trip]
    const out = new Float64Array(n)
    if (shape) {
      let allGiven = shape.metresPerUnit !== null
      for (let k = 0; k < n && allGiven; k++) if (Number.isNaN(rows.given[idx[k]])) allGiven = false
      if (allGiven) {
        for (let k = 0; k < n; k++) {
          const g = rows.given[idx[k]]
          if (k > 0 && g < rows.given[idx[k - 1]]) {
            st.findings.error('shape_dist', { file: FILE, line: rows.line[idx[k]], field: 'shape_dist_traveled', value: String(g), message: `shape_dist_traveled decreases along the trip ${st.tripIds[trip]}.` })
            return null
          }
          out[k] = g * shape.metresPerUnit!
        }
        return out
      }
      return this.projected(rows, idx, shape)
    }
    for (let k = 1; k < n; k++) {
      const a = rows.stop[idx[k - 1]], b = rows.stop[idx[k]]
      out[k] = out[k - 1] + haversineM(st.stopLat[a], st.stopLon[a], st.stopLat[b], st.stopLon[b])
    }
    return out
  }

  /** Stops projected in order onto the shape; trips of one pattern share the result. */
  private projected(rows: Rows, idx: Int32Array, shape: ShapeGeometry): Float64Array {
    const st = this.st
    let key = `${shape.index}`
    for (let k = 0; k < idx.length; k++) key += `,${rows.stop[idx[k]]}`
    const cached = this.patterns.get(key)
    if (cached) return cached
    const out = new Float64Array(idx.length)
    let seg = 0, dist = 0
    for (let k = 0; k < idx.length; k++) {
      const s = rows.stop[idx[k]]
      const p = projectOntoPolyline(st.stopLat[s], st.stopLon[s], shape.lat, shape.lon, shape.distM, seg, dist)
      if (p.offsetM > FAR_FROM_SHAPE_M) {
        st.findings.warning('stop_far_from_shape', { file: FILE, line: rows.line[idx[k]], field: 'stop_id', value: st.stopIds[s], message: `The stop lies ${Math.round(p.offsetM)} m from the shape ${shape.id} of its trip.` })
      }
      seg = p.segment
      dist = p.distM
      out[k] = p.distM
    }
    this.patterns.set(key, out)
    return out
  }
}

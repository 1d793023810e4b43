// shapes.txt: points gathered per shape (in any order in the file), sorted by sequence, measured
// in metres. shape_dist_traveled is in the feed's own unit; Fanlight converts it to metres by
// comparing it with the shape's measured length (metres, kilometres, feet, miles or yards when
// the ratio is within 15% of one of them, else the ratio itself).
import { cumulativeDistanceM } from '../../../shared/gtfs/geo'
import type { FeedState, ShapeGeometry } from './feed-state'
import { readGtfsFile, type ReadContext, type ReadOutcome } from './read-file'
import type { ZipEntry } from './zip'

interface Gathering {
  seq: number[]
  lat: number[]
  lon: number[]
  given: number[]
  line: number[]
}

const UNITS_M = [1, 1000, 0.3048, 1609.344, 0.9144]

export function metresPerUnit(measuredM: number, givenTotal: number): number {
  const ratio = measuredM / givenTotal
  for (const u of UNITS_M) if (Math.abs(ratio / u - 1) < 0.15) return u
  return ratio
}

const round1 = (x: number) => Math.round(x * 10) / 10

export async function readShapes(st: FeedState, ctx: ReadContext, entry: ZipEntry): Promise<ReadOutcome> {
  const file = 'shapes.txt'
  const f = st.findings
  const gathered = new Map<string, Gathering>()
  const out = await readGtfsFile(ctx, file, entry, (r, line) => {
    let g = gathered.get(r.shape_id)
    if (!g) gathered.set(r.shape_id, (g = { seq: [], lat: [], lon: [], given: [], line: [] }))
    g.seq.push(Number(r.shape_pt_sequence))
    g.lat.push(Number(r.shape_pt_lat))
    g.lon.push(Number(r.shape_pt_lon))
    g.given.push(r.shape_dist_traveled === '' ? NaN : Number(r.shape_dist_traveled))
    g.line.push(line)
  })
  const w = st.writers.gtfs_shapes
  // Written in shape_id order: PostgreSQL builds the key index of sorted rows far faster.
  for (const id of [...gathered.keys()].sort()) {
    const g = gathered.get(id)!
    const n = g.seq.length
    let order = Array.from({ length: n }, (_, i) => i)
    let sorted = true
    for (let i = 1; i < n; i++) if (g.seq[i] < g.seq[i - 1]) { sorted = false; break }
    if (!sorted) order = order.sort((a, b) => g.seq[a] - g.seq[b])
    let bad = false
    for (let k = 1; k < n; k++) {
      if (g.seq[order[k]] === g.seq[order[k - 1]]) {
        f.error('duplicate_key', { file, line: g.line[order[k]], field: 'shape_pt_sequence', value: String(g.seq[order[k]]), message: `The shape ${id} has two points with this sequence.` })
        bad = true
      }
    }
    if (bad) continue
    const lat = Float64Array.from(order, (i) => g.lat[i])
    const lon = Float64Array.from(order, (i) => g.lon[i])
    const measured = cumulativeDistanceM(lat, lon)
    const given = Float64Array.from(order, (i) => g.given[i])
    let allGiven = true
    for (let k = 0; k < n; k++) {
      if (Number.isNaN(given[k])) { allGiven = false; continue }
      if (k > 0 && !Number.isNaN(given[k - 1]) && given[k] < given[k - 1]) {
        f.error('shape_dist', { file, line: g.line[order[k]], field: 'shape_dist_traveled', value: String(given[k]), message: `shape_dist_traveled decreases along the shape ${id} (${given[k - 1]} before).` })
        bad = true
      }
    }
    if (bad) continue
    if (n < 2) f.warning('short_shape', { file, line: g.line[order[0]], field: 'shape_id', value: id, message: `The shape ${id} has a single point.` })
    const span = allGiven && n > 1 ? given[n - 1] - given[0] : 0
    let unit: number | null = null
    let distM = measured
    if (span > 0 && measured[n - 1] > 0) {
      unit = metresPerUnit(measured[n - 1], span)
      if (!UNITS_M.includes(unit)) {
        f.warning('shape_dist_unit', { file, line: g.line[order[n - 1]], field: 'shape_dist_traveled', value: String(given[n - 1]), message: `The shape ${id} measures ${Math.round(measured[n - 1])} m; its shape_dist_traveled is in no usual unit, so it is scaled to metres.` })
      }
      distM = Float64Array.from(given, (d) => d * unit!)
    }
    const geometry: ShapeGeometry = { index: st.shapes.size, id, lat, lon, distM, metresPerUnit: unit }
    st.shapes.set(id, geometry)
    const sid = Buffer.from(id)
    for (let k = 0; k < n; k++) {
      w.row(7).int(st.feedId).bytes(sid).int(g.seq[order[k]]).float(lat[k]).float(lon[k]).float(given[k]).float(round1(distM[k]))
    }
  }
  return out
}

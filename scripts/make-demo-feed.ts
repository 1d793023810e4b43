// Writes the invented demo feed sample-feeds/lindenmere-gtfs.zip and its description
// sample-feeds/README.md, deterministically (same bytes on every run).
//   node --import tsx scripts/make-demo-feed.ts
// Lindenmere Regional Transit, the City of Brackenford and the City of Osterfield, their streets,
// stops and intersections are all invented for the demonstration.
import { writeFileSync } from 'node:fs'
import { fileURLToPath } from 'node:url'
import { strToU8, zipSync } from 'fflate'
import { cumulativeDistanceM } from '../shared/gtfs/geo'
import { formatGtfsTime } from '../shared/gtfs/time'

const out = (name: string) => fileURLToPath(new URL(`../sample-feeds/${name}`, import.meta.url))

// ---- Geometry: a local metric plane (x east, y north, metres) around an invented origin. ----
const LAT0 = 47.6, LON0 = 8.88
const M_PER_DEG = 111_195
const toLatLon = (x: number, y: number) => ({
  lat: LAT0 + y / M_PER_DEG,
  lon: LON0 + x / (M_PER_DEG * Math.cos((LAT0 * Math.PI) / 180)),
})
const r6 = (v: number) => Math.round(v * 1e6) / 1e6

type XY = [number, number]
/** Waypoints of the corridor, eastbound: Kestrel Avenue to the Millrace, then Harbour Road. */
const CORRIDOR: XY[] = [[0, 0], [1800, 350], [3400, 500], [4600, 900], [5200, 1150], [6400, 1100], [7600, 800], [8700, 700]]
/** Index of the waypoint where Kestrel Avenue crosses the Millrace and becomes Harbour Road. */
const BOUNDARY_WAYPOINT = 4

function planarLengths(pts: XY[]) {
  const cum = [0]
  for (let i = 1; i < pts.length; i++) cum.push(cum[i - 1] + Math.hypot(pts[i][0] - pts[i - 1][0], pts[i][1] - pts[i - 1][1]))
  return cum
}
/** The point `d` metres along a planar polyline, and its unit direction. */
function along(pts: XY[], d: number): { p: XY; dir: XY } {
  const cum = planarLengths(pts)
  let i = 0
  while (i < pts.length - 2 && cum[i + 1] < d) i++
  const seg = cum[i + 1] - cum[i]
  const f = Math.max(0, Math.min(1, (d - cum[i]) / seg))
  const dx = (pts[i + 1][0] - pts[i][0]) / seg, dy = (pts[i + 1][1] - pts[i][1]) / seg
  return { p: [pts[i][0] + f * (pts[i + 1][0] - pts[i][0]), pts[i][1] + f * (pts[i + 1][1] - pts[i][1])], dir: [dx, dy] }
}

// ---- The scenario ----
interface Intersection { name: string; cross: string; street: string; city: 'City of Brackenford' | 'City of Osterfield'; d: number }
const INTERSECTIONS: Intersection[] = [
  { street: 'Kestrel Avenue', cross: 'Tanner Street', d: 420 },
  { street: 'Kestrel Avenue', cross: 'Quillfeather Lane', d: 1260 },
  { street: 'Kestrel Avenue', cross: 'Foundry Road', d: 2050 },
  { street: 'Kestrel Avenue', cross: 'Alder Crescent', d: 2900 },
  { street: 'Kestrel Avenue', cross: 'Marlowe Street', d: 3750 },
  { street: 'Kestrel Avenue', cross: 'Saltings Way', d: 4620 },
  { street: 'Harbour Road', cross: 'Bellwether Street', d: 5980 },
  { street: 'Harbour Road', cross: 'Copperbeech Avenue', d: 6850 },
  { street: 'Harbour Road', cross: 'Ropewalk Lane', d: 7620 },
  { street: 'Harbour Road', cross: 'Dockyard Gate', d: 8350 },
].map((i) => ({ ...i, name: `${i.street} & ${i.cross}`, city: i.street === 'Kestrel Avenue' ? 'City of Brackenford' : 'City of Osterfield' }))

/** Corridor stops: planar distance eastbound (d0) and of the westbound stop (d1), same axis. */
const CORRIDOR_STOPS: { key: string; name: string; d0: number; d1: number; timepoint?: boolean }[] = [
  { key: '01', name: 'Brackenford Interchange', d0: 0, d1: 0, timepoint: true },
  { key: '02', name: 'Tanner Street', d0: 470, d1: 375 },
  { key: '03', name: 'Wick Lane', d0: 900, d1: 910 },
  { key: '04', name: 'Quillfeather Lane', d0: 1220, d1: 1215 },
  { key: '05', name: 'Brackenford Library', d0: 1650, d1: 1660, timepoint: true },
  { key: '06', name: 'Foundry Road', d0: 2090, d1: 2090 },
  { key: '07', name: 'Kestrel Park', d0: 2480, d1: 2470 },
  { key: '08', name: 'Alder Crescent', d0: 2860, d1: 2945 },
  { key: '09', name: 'Hobbs Row', d0: 3320, d1: 3330, timepoint: true },
  { key: '10', name: 'Marlowe Street', d0: 3795, d1: 3705 },
  { key: '11', name: 'Saltings Way', d0: 4585, d1: 4660 },
  { key: '12', name: 'Millrace Bridge', d0: 5200, d1: 5215, timepoint: true },
  { key: '13', name: 'Bellwether Street', d0: 6025, d1: 5935 },
  { key: '14', name: 'Osterfield Market', d0: 6430, d1: 6440 },
  { key: '15', name: 'Copperbeech Avenue', d0: 6815, d1: 6890, timepoint: true },
  { key: '16', name: 'Ropewalk Lane', d0: 7665, d1: 7575 },
  { key: '17', name: 'Tidemill', d0: 8000, d1: 8010 },
  { key: '18', name: 'Osterfield Harbour', d0: 8890, d1: 8890, timepoint: true },
]
const EXPRESS_KEYS = ['01', '04', '06', '10', '12', '14', '15']

// Shape vertices: every 25 m, plus every waypoint and every intersection exactly.
function densify(pts: XY[], marks: number[]): { xy: XY[]; planar: number[] } {
  const cum = planarLengths(pts)
  const ds = new Set<number>()
  for (let d = 0; d < cum[cum.length - 1]; d += 25) ds.add(d)
  for (const c of cum) ds.add(c)
  for (const m of marks) ds.add(m)
  const sorted = [...ds].sort((a, b) => a - b)
  return { xy: sorted.map((d) => along(pts, d).p), planar: sorted }
}

const kestrelMarks = INTERSECTIONS.map((i) => i.d)
const main = densify(CORRIDOR, kestrelMarks)
// The express leaves Harbour Road at Ropewalk Lane and runs 1.2 km north to the hospital.
const ropewalk = along(CORRIDOR, 7620).p
const EXPRESS_PATH: XY[] = [...CORRIDOR.slice(0, 7).filter((_, i) => planarLengths(CORRIDOR)[i] < 7620), ropewalk, [ropewalk[0], ropewalk[1] + 1200]]
const express = densify(EXPRESS_PATH, kestrelMarks.filter((d) => d <= 7620))
const HOSPITAL_STOPS = [{ key: 'H1', name: 'Ropewalk Lane North', d: 7620 + 450 }, { key: 'H2', name: 'Osterfield Hospital', d: 7620 + 1190 }]

interface Shape { id: string; lat: number[]; lon: number[]; dist: Float64Array; planar: number[] }
function shapeOf(id: string, xy: XY[], planar: number[], reverse: boolean): Shape {
  const pts = reverse ? [...xy].reverse() : xy
  const ll = pts.map(([x, y]) => toLatLon(x, y))
  const lat = ll.map((p) => r6(p.lat)), lon = ll.map((p) => r6(p.lon))
  const total = planar[planar.length - 1]
  return { id, lat, lon, dist: cumulativeDistanceM(lat, lon), planar: reverse ? [...planar].reverse().map((d) => total - d) : planar }
}
/** Metres along a shape (measured on the Earth, as the import does) at a planar distance along it. */
function measuredAt(s: Shape, planarD: number) {
  let i = 0
  while (i < s.planar.length - 2 && s.planar[i + 1] < planarD) i++
  const f = (planarD - s.planar[i]) / (s.planar[i + 1] - s.planar[i])
  return s.dist[i] + f * (s.dist[i + 1] - s.dist[i])
}

const SHAPES = {
  east: shapeOf('7-E', main.xy, main.planar, false),
  west: shapeOf('7-W', main.xy, main.planar, true),
  expressNorth: shapeOf('17-N', express.xy, express.planar, false),
  expressSouth: shapeOf('17-S', express.xy, express.planar, true),
}
const mainLength = main.planar[main.planar.length - 1]
const expressLength = express.planar[express.planar.length - 1]

// Stops sit 8 m to the right of the direction of travel, on the kerb.
function kerb(path: XY[], d: number, westbound: boolean) {
  const { p, dir } = along(path, d)
  const side = westbound ? -1 : 1
  return toLatLon(p[0] + side * 8 * dir[1], p[1] - side * 8 * dir[0])
}

interface StopRow { id: string; code: string; name: string; lat: number; lon: number; desc: string }
const stops: StopRow[] = []
let code = 1000
for (const s of CORRIDOR_STOPS) {
  const e = kerb(CORRIDOR, s.d0, false), w = kerb(CORRIDOR, s.d1, true)
  stops.push({ id: `K${s.key}E`, code: String(++code), name: s.name, lat: r6(e.lat), lon: r6(e.lon), desc: 'towards Osterfield Harbour' })
  stops.push({ id: `K${s.key}W`, code: String(++code), name: s.name, lat: r6(w.lat), lon: r6(w.lon), desc: 'towards Brackenford Interchange' })
}
for (const h of HOSPITAL_STOPS) {
  const n = kerb(EXPRESS_PATH, h.d, false), s = kerb(EXPRESS_PATH, h.d, true)
  stops.push({ id: `${h.key}N`, code: String(++code), name: h.name, lat: r6(n.lat), lon: r6(n.lon), desc: 'northbound' })
  stops.push({ id: `${h.key}S`, code: String(++code), name: h.name, lat: r6(s.lat), lon: r6(s.lon), desc: 'southbound' })
}
// Route 21, a loop in Brackenford south of Kestrel Avenue; route 34 in Osterfield, no shape.
const FERNHILL: XY[] = [[900, -150], [900, -1300], [2300, -1700], [2900, -900], [2100, -150], [900, -150]]
const FERNHILL_STOPS = ['Fernhill Green', 'Orchard Close', 'Fernhill School', 'Brambleside', 'Larkspur Road', 'Kiln Yard']
const fernLength = planarLengths(FERNHILL).at(-1)!
FERNHILL_STOPS.forEach((name, i) => {
  const p = kerb(FERNHILL, (i * fernLength) / FERNHILL_STOPS.length, false)
  stops.push({ id: `F${i + 1}`, code: String(++code), name, lat: r6(p.lat), lon: r6(p.lon), desc: 'Fernhill loop' })
})
const SALTMARSH: XY[] = [[7000, 2600], [7600, 3100], [8200, 3600], [8700, 4000], [9300, 4400]]
const SALTMARSH_STOPS = ['Saltmarsh Lane', 'Gullcote', 'Reedbed Walk', 'Heron Quay', 'Saltmarsh End']
SALTMARSH_STOPS.forEach((name, i) => {
  const p = toLatLon(...SALTMARSH[i])
  stops.push({ id: `M${i + 1}`, code: String(++code), name, lat: r6(p.lat), lon: r6(p.lon), desc: '' })
})
const fern = densify(FERNHILL, [])
const fernShape = shapeOf('21-L', fern.xy, fern.planar, false)

// ---- Timetables ----
type Service = 'WKDY' | 'SAT' | 'SUN'
const trips: string[] = []
const stopTimes: string[] = []
const frequencies: string[] = []
const hhmm = (s: number) => formatGtfsTime(s).slice(0, 5).replace(':', '')

/**
 * One trip along `stopsAlong` (stop id, metres along its shape, timepoint?). Running time spread
 * over the distance plus 20 s at each stop; timepoints get whole-minute times, the others none.
 */
function addTrip(route: string, service: Service, dir: number, tripId: string, headsign: string, shape: Shape | null,
  stopsAlong: { id: string; d: number; timepoint: boolean }[], startS: number, runS: number, withDist: boolean) {
  trips.push(`${route},${service},${tripId},${headsign},${dir},${shape ? shape.id : ''}`)
  const total = stopsAlong[stopsAlong.length - 1].d
  const dwell = 20 * (stopsAlong.length - 2)
  stopsAlong.forEach((s, k) => {
    const last = k === stopsAlong.length - 1
    const t = startS + Math.round(((runS - dwell) * s.d) / total + 20 * Math.max(0, k - 0.5))
    const timed = k === 0 || last || s.timepoint
    const arr = last ? Math.ceil(t / 60) * 60 : Math.round(t / 60) * 60
    // Millrace Bridge is the timing point between the two cities: a minute's hold eastbound.
    const dep = timed && !last && k > 0 && s.id === 'K12E' ? arr + 60 : arr
    const times = timed ? `${formatGtfsTime(k === 0 ? startS : arr)},${formatGtfsTime(k === 0 ? startS : dep)}` : ','
    stopTimes.push(`${tripId},${times},${s.id},${k + 1},${withDist ? (Math.round(s.d * 10) / 10).toFixed(1) : ''},${timed ? 1 : 0}`)
  })
}

const corridorAlong = (westbound: boolean, keys?: string[]) => {
  const shape = westbound ? SHAPES.west : SHAPES.east
  const list = CORRIDOR_STOPS.filter((s) => !keys || keys.includes(s.key))
  const ordered = westbound ? [...list].reverse() : list
  return ordered.map((s) => ({
    id: `K${s.key}${westbound ? 'W' : 'E'}`,
    d: measuredAt(shape, westbound ? mainLength - s.d1 : s.d0),
    timepoint: !!s.timepoint,
  }))
}
const at = (h: number, m = 0) => h * 3600 + m * 60
/** Starts from `from` up to (excluding) `to` every `every` minutes. */
const starts = (from: number, to: number, every: number) => { const r: number[] = []; for (let t = from; t < to; t += every * 60) r.push(t); return r }

// Route 7: running time by time of day (peak slower), both directions.
const run7 = (t: number, s: Service) => (s === 'WKDY' && ((t >= at(7) && t < at(9)) || (t >= at(15, 30) && t < at(18, 30))) ? 34 : t >= at(20) ? 26 : 30) * 60
const plan7: Record<Service, [number, number, number][]> = {
  WKDY: [[at(5, 30), at(7), 15], [at(7), at(9), 8], [at(9), at(15, 30), 12], [at(15, 30), at(18, 30), 8], [at(18, 30), at(20), 15]],
  SAT: [[at(6), at(20), 15]],
  SUN: [[at(7), at(19), 20]],
}
// Evenings run from frequencies.txt: weekdays schedule-based (exact_times 1), weekends
// frequency-based (exact_times empty or 0). The windows run past midnight.
const evening7: Record<Service, { from: number; to: number; headway: number; exact: string }> = {
  WKDY: { from: at(20), to: at(24, 30), headway: 1200, exact: '1' },
  SAT: { from: at(20), to: at(25), headway: 1800, exact: '' },
  SUN: { from: at(19), to: at(24), headway: 1800, exact: '0' },
}
for (const service of ['WKDY', 'SAT', 'SUN'] as Service[]) {
  for (const dir of [0, 1]) {
    const westbound = dir === 1
    const headsign = westbound ? 'Brackenford Interchange' : 'Osterfield Harbour'
    const shape = westbound ? SHAPES.west : SHAPES.east
    const tag = westbound ? 'W' : 'E'
    for (const [from, to, every] of plan7[service]) {
      for (const t of starts(from + (westbound ? 5 * 60 : 0), to, every)) {
        addTrip('7', service, dir, `7-${service}-${tag}-${hhmm(t)}`, headsign, shape, corridorAlong(westbound), t, run7(t, service), true)
      }
    }
    const ev = evening7[service]
    const template = `7-${service}-${tag}-EVENING`
    addTrip('7', service, dir, template, headsign, shape, corridorAlong(westbound), ev.from, run7(ev.from, service), true)
    frequencies.push(`${template},${formatGtfsTime(ev.from)},${formatGtfsTime(ev.to)},${ev.headway},${ev.exact}`)
    if (service === 'SAT') {
      // Two late Saturday trips after the evening window, well past midnight.
      for (const t of [at(25, 10), at(25, 50)]) addTrip('7', service, dir, `7-SAT-${tag}-${hhmm(t)}`, headsign, shape, corridorAlong(westbound), t, 24 * 60, true)
    }
  }
}

// Route 17 Kestrel Express: weekday peaks, limited stops, to the hospital.
for (const dir of [0, 1]) {
  const north = dir === 0
  const shape = north ? SHAPES.expressNorth : SHAPES.expressSouth
  const corridorPart = CORRIDOR_STOPS.filter((s) => EXPRESS_KEYS.includes(s.key))
  const list = [
    ...corridorPart.map((s) => ({ id: `K${s.key}${north ? 'E' : 'W'}`, planar: north ? s.d0 : s.d1, timepoint: !!s.timepoint })),
    ...HOSPITAL_STOPS.map((h) => ({ id: `${h.key}${north ? 'N' : 'S'}`, planar: h.d, timepoint: h.key === 'H2' })),
  ]
  const ordered = north ? list : [...list].reverse()
  const along17 = ordered.map((s) => ({ id: s.id, d: measuredAt(shape, north ? s.planar : expressLength - s.planar), timepoint: s.timepoint }))
  for (const t of [...starts(at(6, 45), at(9), 15), ...starts(at(15, 30), at(18, 30), 15)]) {
    addTrip('17', 'WKDY', dir, `17-WKDY-${north ? 'N' : 'S'}-${hhmm(t)}`, north ? 'Osterfield Hospital' : 'Brackenford Interchange', shape, along17, t, 24 * 60, true)
  }
}

// Route 21 Fernhill Circular: hourly on weekdays, one way round; its stop_times give no distances.
const fernAlong = [...FERNHILL_STOPS.map((_, i) => ({ id: `F${i + 1}`, d: (i * fernShape.dist.at(-1)!) / FERNHILL_STOPS.length, timepoint: i % 2 === 0 })),
  { id: 'F1', d: fernShape.dist.at(-1)!, timepoint: true }]
for (const t of starts(at(7, 10), at(19), 60)) addTrip('21', 'WKDY', 0, `21-WKDY-${hhmm(t)}`, 'Fernhill Circular', fernShape, fernAlong, t, 18 * 60, false)

// Route 34 Saltmarsh Lane: every 30 minutes on weekdays and Saturdays; no shape in the feed.
const saltCum = planarLengths(SALTMARSH)
for (const service of ['WKDY', 'SAT'] as Service[]) {
  for (const dir of [0, 1]) {
    const ids = SALTMARSH_STOPS.map((_, i) => `M${i + 1}`)
    const order = dir === 0 ? ids.map((id, i) => ({ id, d: saltCum[i], timepoint: true })) : [...ids].reverse().map((id, i) => ({ id, d: saltCum.at(-1)! - saltCum[ids.length - 1 - i], timepoint: true }))
    for (const t of starts(at(6, 30) + dir * 15 * 60, at(19, 30), 30)) {
      addTrip('34', service, dir, `34-${service}-${dir ? 'S' : 'N'}-${hhmm(t)}`, dir ? 'Saltmarsh Lane' : 'Saltmarsh End', null, order, t, 12 * 60, false)
    }
  }
}

// ---- Files ----
const csvField = (s: string) => (/[",\n]/.test(s) ? `"${s.replaceAll('"', '""')}"` : s)
const lines = (header: string, rows: string[]) => `${header}\n${rows.join('\n')}\n`
const shapeRows = [SHAPES.east, SHAPES.west, SHAPES.expressNorth, SHAPES.expressSouth, fernShape]
  .flatMap((s) => s.lat.map((lat, i) => `${s.id},${lat},${s.lon[i]},${i + 1},${(Math.round(s.dist[i] * 10) / 10).toFixed(1)}`))

const files: Record<string, string> = {
  'agency.txt': lines('agency_id,agency_name,agency_url,agency_timezone,agency_lang,agency_phone,agency_email',
    ['LRT,Lindenmere Regional Transit,https://lindenmere-transit.example/,Etc/GMT-1,en,+00 555 0100,travel@lindenmere-transit.example']),
  'stops.txt': lines('stop_id,stop_code,stop_name,stop_desc,stop_lat,stop_lon,location_type,wheelchair_boarding',
    stops.map((s) => `${s.id},${s.code},${csvField(s.name)},${csvField(s.desc)},${s.lat},${s.lon},0,1`)),
  'routes.txt': lines('route_id,agency_id,route_short_name,route_long_name,route_desc,route_type,route_color,route_text_color,route_sort_order', [
    '7,LRT,7,Kestrel Avenue,"Brackenford Interchange - Kestrel Avenue - Harbour Road - Osterfield Harbour",3,1F6F8B,FFFFFF,1',
    '17,LRT,17,Kestrel Express,"Limited stops on Kestrel Avenue and Harbour Road, then Ropewalk Lane to Osterfield Hospital",3,C0392B,FFFFFF,2',
    '21,LRT,21,Fernhill Circular,Brackenford neighbourhood loop,3,27AE60,FFFFFF,3',
    '34,LRT,34,Saltmarsh Lane,Osterfield neighbourhood line,3,8E44AD,FFFFFF,4',
  ]),
  'calendar.txt': lines('service_id,monday,tuesday,wednesday,thursday,friday,saturday,sunday,start_date,end_date', [
    'WKDY,1,1,1,1,1,0,0,20260907,20270905',
    'SAT,0,0,0,0,0,1,0,20260907,20270905',
    'SUN,0,0,0,0,0,0,1,20260907,20270905',
  ]),
  // Public holidays run the Sunday timetable (Founders' Day, an invented local holiday, the Saturday one).
  'calendar_dates.txt': lines('service_id,date,exception_type', [
    'WKDY,20261225,2', 'SUN,20261225,1',
    'SAT,20261226,2', 'SUN,20261226,1',
    'WKDY,20270101,2', 'SUN,20270101,1',
    'WKDY,20270514,2', 'SAT,20270514,1',
  ]),
  'shapes.txt': lines('shape_id,shape_pt_lat,shape_pt_lon,shape_pt_sequence,shape_dist_traveled', shapeRows),
  'trips.txt': lines('route_id,service_id,trip_id,trip_headsign,direction_id,shape_id', trips),
  'stop_times.txt': lines('trip_id,arrival_time,departure_time,stop_id,stop_sequence,shape_dist_traveled,timepoint', stopTimes),
  'frequencies.txt': lines('trip_id,start_time,end_time,headway_secs,exact_times', frequencies),
  'feed_info.txt': lines('feed_publisher_name,feed_publisher_url,feed_lang,feed_start_date,feed_end_date,feed_version,feed_contact_email',
    ['Lindenmere Regional Transit,https://lindenmere-transit.example/,en,20260907,20270905,2026-09 demo,data@lindenmere-transit.example']),
}
const zip = zipSync(Object.fromEntries(Object.entries(files).map(([name, text]) => [name, [strToU8(text), { level: 9, mtime: new Date(2026, 8, 1) }]])))
writeFileSync(out('lindenmere-gtfs.zip'), zip)

// ---- README ----
const fmt = (m: number) => Math.round(m).toLocaleString('en').replace(/,/g, ' ')
const stopTable = CORRIDOR_STOPS.map((s) => {
  const city = s.d0 <= planarLengths(CORRIDOR)[BOUNDARY_WAYPOINT] ? 'Brackenford' : 'Osterfield'
  return `| ${s.name} | K${s.key}E | ${fmt(measuredAt(SHAPES.east, s.d0))} | K${s.key}W | ${fmt(measuredAt(SHAPES.west, mainLength - s.d1))} | ${city} |${s.timepoint ? ' timepoint |' : ' |'}`
})
const relation = (i: Intersection, westbound: boolean) => {
  // The stop nearest the intersection in this direction, within 120 m, before it (near-side) or after (far-side).
  let best: { name: string; gap: number } | null = null
  for (const s of CORRIDOR_STOPS) {
    const pos = westbound ? s.d1 : s.d0
    const gap = westbound ? i.d - pos : pos - i.d // > 0: after the intersection in the direction of travel
    if (Math.abs(gap) <= 120 && (!best || Math.abs(gap) < Math.abs(best.gap))) best = { name: s.name, gap }
  }
  return best ? `${best.gap > 0 ? 'far-side' : 'near-side'} (${Math.round(Math.abs(best.gap))} m)` : 'none'
}
const intersectionTable = INTERSECTIONS.map((i, n) => {
  const k = SHAPES.east.planar.indexOf(i.d)
  return `| ${n + 1} | ${i.name} | ${i.city} | ${SHAPES.east.lat[k].toFixed(6)} | ${SHAPES.east.lon[k].toFixed(6)} | ${fmt(SHAPES.east.dist[k])} | ${fmt(measuredAt(SHAPES.west, mainLength - i.d))} | ${relation(i, false)} | ${relation(i, true)} |`
})
const counts = Object.fromEntries(Object.entries(files).map(([k, v]) => [k, v.split('\n').length - 2]))

const readme = `# Demo feed: Lindenmere Regional Transit

\`lindenmere-gtfs.zip\` is a GTFS Schedule feed of an invented agency, written by
\`node --import tsx scripts/make-demo-feed.ts\` (deterministic: the same bytes on every run; this
page is written by the same script). The agency, the City of Brackenford, the City of Osterfield,
their streets, stops and intersections are all invented. The demo seed imports the feed once
through the real import (\`server/seed/demo-feed.ts\`).

## The corridor

Kestrel Avenue runs east-north-east from Brackenford Interchange for ${fmt(planarLengths(CORRIDOR)[BOUNDARY_WAYPOINT])} m to the
Millrace, the stream that is the boundary between the two cities; across Millrace Bridge the same
street is Harbour Road, in Osterfield, down to Osterfield Harbour: ${fmt(SHAPES.east.dist.at(-1)!)} m in all
(shape \`7-E\` eastbound, \`7-W\` westbound; both follow the same points, \`shape_dist_traveled\` in
metres). Stops stand on the kerb, 8 m to the right of the direction of travel.

| route | name | service |
| --- | --- | --- |
| 7 | Kestrel Avenue | the trunk: all ${CORRIDOR_STOPS.length} stops each way. Weekdays 05:30-20:00 every 15 min, every 8 min 07:00-09:00 and 15:30-18:30 (peak running time 34 min, else 30), every 12 min between; Saturdays every 15 min 06:00-20:00; Sundays every 20 min 07:00-19:00. Evenings from \`frequencies.txt\`: weekdays 20:00-24:30 every 20 min, schedule-based (\`exact_times\` 1); Saturdays 20:00-25:00 every 30 min and Sundays 19:00-24:00 every 30 min, frequency-based (\`exact_times\` empty / 0). Two late Saturday trips at 25:10 and 25:50. Eastbound trips hold a minute at Millrace Bridge. |
| 17 | Kestrel Express | weekday peaks 06:45-09:00 and 15:30-18:30 every 15 min; ${EXPRESS_KEYS.length} corridor stops, then it turns north at Ropewalk Lane for 1.2 km to Osterfield Hospital (shapes \`17-N\`, \`17-S\`, the corridor's points as far as Ropewalk Lane). |
| 21 | Fernhill Circular | a Brackenford loop south of Kestrel Avenue, hourly on weekdays; its stop_times give no distances (the import projects the stops on shape \`21-L\`). |
| 34 | Saltmarsh Lane | an Osterfield line north of Harbour Road, every 30 min on weekdays and Saturdays; no shape. |

Only timepoints carry times (\`timepoint\` 1); the other stops leave arrival and departure blank
for the import to interpolate along the shape. Service runs 2026-09-07 to 2027-09-05 (\`WKDY\`,
\`SAT\`, \`SUN\`); on 25 and 26 December and 1 January the Sunday timetable runs, and on Founders' Day
(14 May 2027, an invented local holiday) the Saturday one.

Counts: ${Object.entries(counts).map(([k, v]) => `${k.replace('.txt', '')} ${v}`).join(', ')}.

## Corridor stops

Distances in metres along the route 7 shape of each direction (as the import stores them).

| stop | eastbound id | m along 7-E | westbound id | m along 7-W | city | |
| --- | --- | ---: | --- | ---: | --- | --- |
${stopTable.join('\n')}

Route 17 also serves Ropewalk Lane North (H1N / H1S) and Osterfield Hospital (H2N / H2S) on its branch.

## Signalised intersections along the corridor

Each point lies on the corridor shape (it is one of its points). Distances are along 7-E and 7-W;
the last two columns give the route 7 stop within 120 m of the intersection in each direction and
whether it stands before the stop line (near-side) or after the intersection (far-side). The
Brackenford intersections belong to the City of Brackenford's engineers, the Harbour Road ones to
the City of Osterfield's: this is the list the signal timing CSV of the demo is built from.

| # | intersection | jurisdiction | lat | lon | m along 7-E | m along 7-W | stop eastbound | stop westbound |
| ---: | --- | --- | ---: | ---: | ---: | ---: | --- | --- |
${intersectionTable.join('\n')}
`
writeFileSync(out('README.md'), readme)
console.log(`wrote sample-feeds/lindenmere-gtfs.zip (${zip.length} bytes) and sample-feeds/README.md`)

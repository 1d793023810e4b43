// A deterministic synthetic GTFS feed of any size for the import benchmark (and the API test
// that needs an import slow enough to overlap): a grid city of routes, weekday, Saturday and
// Sunday timetables from 05:00 to past 01:00, blank times at non-timepoints, shapes with
// shape_dist_traveled in metres and stop_times with or without it.
import { createWriteStream, type WriteStream } from 'node:fs'
import { Zip, ZipDeflate } from 'fflate'

export interface SyntheticOptions {
  routes: number
  stopsPerTrip: number
  /** Trips per route and direction on a weekday; Saturday has half, Sunday a third. */
  weekdayTrips: number
}

/** 120 routes x 2 directions x (57 + 28 + 19) trips x 40 stops = 998 400 stop_times. */
export const MILLION_STOP_TIMES: SyntheticOptions = { routes: 120, stopsPerTrip: 40, weekdayTrips: 57 }

const POINTS_PER_GAP = 8
const PALETTE = ['1F6F8B', 'C0392B', '27AE60', '8E44AD', 'D35400', '2C3E50']

const pad = (n: number, w: number) => String(n).padStart(w, '0')
const hms = (s: number) => `${pad(Math.floor(s / 3600), 2)}:${pad(Math.floor(s / 60) % 60, 2)}:${pad(s % 60, 2)}`

/** Writes the zip; if `stopTimesCsv` is given, also writes stop_times.txt there as plain text. */
export async function writeSyntheticFeed(zipPath: string, o: SyntheticOptions, stopTimesCsv?: string): Promise<{ stopTimes: number; trips: number; shapePoints: number }> {
  const out = createWriteStream(zipPath)
  const plain = stopTimesCsv ? createWriteStream(stopTimesCsv) : null
  const done = new Promise<void>((resolve, reject) => { out.on('finish', resolve); out.on('error', reject) })
  const zip = new Zip((err, chunk, final) => {
    if (err) throw err
    out.write(chunk)
    if (final) out.end()
  })
  const file = (name: string) => {
    const f = new ZipDeflate(name, { level: 1 })
    f.mtime = new Date('2026-09-01T00:00:00Z')
    zip.add(f)
    let buf: string[] = []
    let size = 0
    return {
      line(s: string, copy?: WriteStream | null) {
        buf.push(s)
        size += s.length
        if (size > 1 << 20) this.flush(copy)
      },
      flush(copy?: WriteStream | null) {
        const text = buf.join('\n') + '\n'
        f.push(new TextEncoder().encode(text))
        copy?.write(text)
        buf = []
        size = 0
      },
      end(copy?: WriteStream | null) {
        if (buf.length) this.flush(copy)
        f.push(new Uint8Array(0), true)
      },
    }
  }
  const lat0 = 47.5, lon0 = 8.7
  // Each route runs east-west or north-south across a grid; stops 400 m apart.
  const stepDeg = 400 / 111_195
  const route = (r: number) => ({ horizontal: r % 2 === 0, offset: Math.floor(r / 2) })
  const stopId = (r: number, k: number) => `STP-${pad(r, 3)}-${pad(k, 3)}`
  const stopPos = (r: number, k: number) => {
    const { horizontal, offset } = route(r)
    return horizontal
      ? { lat: lat0 + offset * stepDeg * 1.5, lon: lon0 + (k * stepDeg) / Math.cos((47.5 * Math.PI) / 180) }
      : { lat: lat0 + k * stepDeg, lon: lon0 + (offset * stepDeg * 1.5) / Math.cos((47.5 * Math.PI) / 180) }
  }

  const agency = file('agency.txt')
  agency.line('agency_id,agency_name,agency_url,agency_timezone,agency_lang')
  agency.line('SYN,Synthetic Transit,https://synthetic.invalid/,Europe/Zurich,en')
  agency.end()

  const stops = file('stops.txt')
  stops.line('stop_id,stop_code,stop_name,stop_lat,stop_lon,location_type,wheelchair_boarding')
  for (let r = 0; r < o.routes; r++) {
    for (let k = 0; k < o.stopsPerTrip; k++) {
      const p = stopPos(r, k)
      stops.line(`${stopId(r, k)},${r * 100 + k},"Route ${r + 1} stop ${k + 1}, platform A",${p.lat.toFixed(6)},${p.lon.toFixed(6)},0,1`)
    }
  }
  stops.end()

  const routes = file('routes.txt')
  routes.line('route_id,agency_id,route_short_name,route_long_name,route_type,route_color,route_text_color')
  for (let r = 0; r < o.routes; r++) routes.line(`R${pad(r + 1, 3)},SYN,${r + 1},Synthetic line ${r + 1},3,${PALETTE[r % PALETTE.length]},FFFFFF`)
  routes.end()

  const calendar = file('calendar.txt')
  calendar.line('service_id,monday,tuesday,wednesday,thursday,friday,saturday,sunday,start_date,end_date')
  calendar.line('WKD,1,1,1,1,1,0,0,20260907,20270905')
  calendar.line('SAT,0,0,0,0,0,1,0,20260907,20270905')
  calendar.line('SUN,0,0,0,0,0,0,1,20260907,20270905')
  calendar.end()
  const dates = file('calendar_dates.txt')
  dates.line('service_id,date,exception_type')
  for (const d of ['20261225', '20270101']) { dates.line(`WKD,${d},2`); dates.line(`SUN,${d},1`) }
  dates.end()

  // Shapes: the stops' line with four points between stops, distances in metres.
  const shapes = file('shapes.txt')
  shapes.line('shape_id,shape_pt_lat,shape_pt_lon,shape_pt_sequence,shape_dist_traveled')
  let shapePoints = 0
  for (let r = 0; r < o.routes; r++) {
    for (const dir of [0, 1]) {
      let seq = 0
      for (let k = 0; k < o.stopsPerTrip - 1; k++) {
        const a = stopPos(r, dir ? o.stopsPerTrip - 1 - k : k), b = stopPos(r, dir ? o.stopsPerTrip - 2 - k : k + 1)
        const last = k === o.stopsPerTrip - 2
        for (let j = 0; j < POINTS_PER_GAP || (last && j === POINTS_PER_GAP); j++) {
          const f = j / POINTS_PER_GAP
          shapes.line(`SHP-R${pad(r + 1, 3)}-${dir},${(a.lat + f * (b.lat - a.lat)).toFixed(6)},${(a.lon + f * (b.lon - a.lon)).toFixed(6)},${seq++},${(k * 400 + f * 400).toFixed(1)}`)
          shapePoints++
        }
      }
    }
  }
  shapes.end()

  const trips = file('trips.txt')
  trips.line('route_id,service_id,trip_id,trip_headsign,direction_id,block_id,shape_id,wheelchair_accessible')
  const times = file('stop_times.txt')
  const header = 'trip_id,arrival_time,departure_time,stop_id,stop_sequence,pickup_type,drop_off_type,shape_dist_traveled,timepoint'
  times.line(header, plain)
  let stopTimes = 0, tripCount = 0
  for (let r = 0; r < o.routes; r++) {
    for (const dir of [0, 1]) {
      for (const [service, share] of [['WKD', 1], ['SAT', 2], ['SUN', 3]] as const) {
        const n = Math.floor(o.weekdayTrips / share)
        // From 05:00 to about 25:30: past midnight on purpose.
        const span = 20.5 * 3600
        for (let t = 0; t < n; t++) {
          const start = 5 * 3600 + Math.floor((t * span) / n) + ((r * 37) % 300)
          const tripId = `R${pad(r + 1, 3)}-${service}-${dir}-${hms(start).replaceAll(':', '').slice(0, 4)}-${pad(t, 3)}`
          trips.line(`R${pad(r + 1, 3)},${service},${tripId},"Synthetic ${r + 1} ${dir ? 'west' : 'east'}bound",${dir},B${pad(r + 1, 3)}-${service}-${t % 12},SHP-R${pad(r + 1, 3)}-${dir},1`)
          tripCount++
          const withDist = r % 2 === 0
          for (let k = 0; k < o.stopsPerTrip; k++) {
            const timed = k % 3 === 0 || k === o.stopsPerTrip - 1
            const arr = start + k * 95
            const dep = arr + (k === 0 || k === o.stopsPerTrip - 1 ? 0 : 20)
            const stop = stopId(r, dir ? o.stopsPerTrip - 1 - k : k)
            times.line(`${tripId},${timed ? hms(arr) : ''},${timed ? hms(dep) : ''},${stop},${k + 1},0,0,${withDist ? (k * 400).toFixed(1) : ''},${timed ? 1 : 0}`, plain)
            stopTimes++
          }
        }
      }
    }
  }
  trips.end()
  times.end(plain)
  zip.end()
  await done
  if (plain) await new Promise<void>((resolve) => plain.end(resolve))
  return { stopTimes, trips: tripCount, shapePoints }
}

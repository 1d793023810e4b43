// A deterministic synthetic feed for the savings benchmark: one straight street with 31 stops
// 400 m apart and 30 signals, three routes running it both
// ways, about 1,500 eastbound trips on a weekday (fewer at weekends), a year of service from
// 2026-12-01 with holiday exceptions. A signal stands 60 m before each stop after the first.
import { strToU8, zipSync } from 'fflate'

export const STOPS = 31
export const LAT = 52.0
const M_PER_DEG_LON = 111_195 * Math.cos((LAT * Math.PI) / 180)
export const STOP_SPACING_M = 400
export const lonAt = (m: number) => Number((m / M_PER_DEG_LON).toFixed(6))
/** Signal positions: 60 m before each stop after the first. */
export const SIGNAL_LON = Array.from({ length: STOPS - 1 }, (_, i) => lonAt((i + 1) * STOP_SPACING_M - 60))

const ROUTES = ['R1', 'R2', 'R3']
// Weekday headways (min) by clock window; Saturday x 1.6, Sunday x 2.4.
const WEEKDAY_HEADWAYS: [number, number, number][] = [
  [5 * 60, 7 * 60, 4], [7 * 60, 9 * 60, 1.5], [9 * 60, 15 * 60, 2.4], [15 * 60, 18 * 60, 1.5], [18 * 60, 22 * 60, 3], [22 * 60, 25 * 60, 4],
]

const pad = (n: number) => String(n).padStart(2, '0')
const hms = (s: number) => `${pad(Math.floor(s / 3600))}:${pad(Math.floor(s / 60) % 60)}:${pad(s % 60)}`

function starts(factor: number, offsetMin: number): number[] {
  const out: number[] = []
  for (const [a, b, h] of WEEKDAY_HEADWAYS) {
    for (let t = a + offsetMin; t < b; t += h * factor) out.push(Math.round(t * 60))
  }
  return out
}

export function savingsFeed(): { zip: Buffer; eastboundWeekdayTrips: number } {
  const stops = ['stop_id,stop_name,stop_lat,stop_lon']
  for (let k = 0; k < STOPS; k++) {
    stops.push(`E${k},Eastbound stop ${k},${LAT + 0.0001},${lonAt(k * STOP_SPACING_M)}`)
    stops.push(`W${k},Westbound stop ${k},${LAT - 0.0003},${lonAt(k * STOP_SPACING_M)}`)
  }
  const shapes = ['shape_id,shape_pt_lat,shape_pt_lon,shape_pt_sequence']
  for (let k = 0; k <= (STOPS - 1) * 4; k++) {
    shapes.push(`EAST,${LAT},${lonAt(k * 100)},${k + 1}`)
    shapes.push(`WEST,${LAT - 0.0002},${lonAt((STOPS - 1) * STOP_SPACING_M - k * 100)},${k + 1}`)
  }
  const trips = ['route_id,service_id,trip_id,direction_id,shape_id']
  const times = ['trip_id,arrival_time,departure_time,stop_id,stop_sequence']
  let eastboundWeekdayTrips = 0
  const services: [string, number][] = [['WK', 1], ['SA', 1.6], ['SU', 2.4]]
  ROUTES.forEach((route, r) => {
    for (const [service, factor] of services) {
      for (const [dir, prefix] of [[0, 'E'], [1, 'W']] as const) {
        for (const [n, start] of starts(factor, r * 0.5 + dir * 0.3).entries()) {
          const id = `${route}-${service}-${prefix}-${n}`
          trips.push(`${route},${service},${id},${dir},${dir === 0 ? 'EAST' : 'WEST'}`)
          if (dir === 0 && service === 'WK') eastboundWeekdayTrips++
          let t = start
          for (let k = 0; k < STOPS; k++) {
            const stop = dir === 0 ? k : STOPS - 1 - k
            const dwell = k === 0 || k === STOPS - 1 ? 0 : 15 + ((k * 7 + n) % 4) * 5
            times.push(`${id},${hms(t)},${hms(t + dwell)},${prefix}${stop},${k + 1}`)
            t += dwell + 50 + ((k * 13 + r * 5) % 5) * 5
          }
        }
      }
    }
  })
  const files: Record<string, string> = {
    'agency.txt': 'agency_id,agency_name,agency_url,agency_timezone\nSYN,Synthetic Transit,https://synthetic.invalid/,Europe/London\n',
    'stops.txt': stops.join('\n') + '\n',
    'routes.txt': ['route_id,agency_id,route_short_name,route_long_name,route_type', ...ROUTES.map((r) => `${r},SYN,${r},Route ${r},3`)].join('\n') + '\n',
    'calendar.txt': [
      'service_id,monday,tuesday,wednesday,thursday,friday,saturday,sunday,start_date,end_date',
      'WK,1,1,1,1,1,0,0,20261201,20271130', 'SA,0,0,0,0,0,1,0,20261201,20271130', 'SU,0,0,0,0,0,0,1,20261201,20271130',
    ].join('\n') + '\n',
    // Two weekday holidays run the Sunday service.
    'calendar_dates.txt': 'service_id,date,exception_type\nWK,20261225,2\nSU,20261225,1\nWK,20270101,2\nSU,20270101,1\n',
    'shapes.txt': shapes.join('\n') + '\n',
    'trips.txt': trips.join('\n') + '\n',
    'stop_times.txt': times.join('\n') + '\n',
  }
  const zip = Buffer.from(zipSync(Object.fromEntries(Object.entries(files).map(([k, v]) => [k, strToU8(v)])), { level: 1 }))
  return { zip, eastboundWeekdayTrips }
}

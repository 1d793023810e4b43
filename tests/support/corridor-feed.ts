// An invented feed for corridor tests: one straight east-west street along latitude 51.0 with five
// stops (S1-S5, 11 m north of the shape), route 7 stopping at all of them and express route 17 at
// S1, S3 and S5, both eastbound (direction 0), and one westbound trip. Two weeks of service from
// Monday 2026-01-05: weekdays (WK), Saturdays (SA), Sundays (SU).
import type { TestApp } from './test-app'
import { waitForJob } from './test-app'
import { zipFeed, type FeedFiles } from './gtfs-fixtures'

export const LAT = 51.0
export const STOP_LON = [-1.9, -1.894, -1.888, -1.882, -1.876]
export const SHAPE_7E_START_LON = -1.901
const lonPoints = (from: number, to: number, step: number) => {
  const out: number[] = []
  for (let x = from; step > 0 ? x <= to + 1e-9 : x >= to - 1e-9; x += step) out.push(Number(x.toFixed(6)))
  return out
}

const hms = (s: number) => [Math.floor(s / 3600), Math.floor(s / 60) % 60, s % 60].map((n) => String(n).padStart(2, '0')).join(':')

/** Stop times of a route 7 trip from `start` (s): leg times between consecutive stops, 20 s dwell. */
function trip7(tripId: string, start: number, legs: number[]): string[] {
  const lines: string[] = []
  let t = start
  STOP_LON.forEach((_, i) => {
    if (i > 0) t += legs[i - 1]
    const dep = i === 0 || i === STOP_LON.length - 1 ? t : t + 20
    lines.push(`${tripId},${hms(t)},${hms(dep)},S${i + 1},${i + 1}`)
    t = dep
  })
  return lines
}

export function corridorFeed(): FeedFiles {
  const shape = (id: string, lons: number[], lat: number) => lons.map((lon, i) => `${id},${lat},${lon},${i + 1}`)
  const h = 3600
  return {
    'agency.txt': 'agency_id,agency_name,agency_url,agency_timezone\nLRT,Test Transit,https://transit.test/,Europe/London\n',
    'stops.txt': ['stop_id,stop_name,stop_lat,stop_lon', ...STOP_LON.map((lon, i) => `S${i + 1},Stop ${i + 1},51.0001,${lon}`),
      ...STOP_LON.map((lon, i) => `W${i + 1},West stop ${i + 1},50.9999,${lon}`), 'FAR,Far away,51.02,-1.9'].join('\n') + '\n',
    'routes.txt': 'route_id,agency_id,route_short_name,route_long_name,route_type\n7,LRT,7,Main line,3\n17,LRT,17,Express,3\n',
    'calendar.txt': [
      'service_id,monday,tuesday,wednesday,thursday,friday,saturday,sunday,start_date,end_date',
      'WK,1,1,1,1,1,0,0,20260105,20260118', 'SA,0,0,0,0,0,1,0,20260105,20260118', 'SU,0,0,0,0,0,0,1,20260105,20260118',
    ].join('\n') + '\n',
    'shapes.txt': ['shape_id,shape_pt_lat,shape_pt_lon,shape_pt_sequence',
      ...shape('SH7E', lonPoints(SHAPE_7E_START_LON, -1.874, 0.001), LAT),
      ...shape('SH17E', lonPoints(-1.91, -1.874, 0.002), LAT),
      ...shape('SH7W', lonPoints(-1.874, -1.901, -0.001), 50.9998)].join('\n') + '\n',
    'trips.txt': [
      'route_id,service_id,trip_id,direction_id,shape_id',
      '7,WK,7-AM,0,SH7E', '7,WK,7-1200,0,SH7E', '7,WK,7-1230,0,SH7E', '7,SA,7-SA,0,SH7E', '7,SU,7-SU,0,SH7E',
      '17,WK,17-0705,0,SH17E', '17,WK,17-0805,0,SH17E', '7,WK,7-W,1,SH7W',
    ].join('\n') + '\n',
    'stop_times.txt': [
      'trip_id,arrival_time,departure_time,stop_id,stop_sequence',
      ...trip7('7-AM', 7 * h, [90, 100, 90, 110]),
      ...trip7('7-1200', 12 * h, [120, 100, 90, 110]),
      ...trip7('7-1230', 12.5 * h, [120, 100, 90, 110]),
      ...trip7('7-SA', 10 * h, [90, 100, 90, 110]),
      ...trip7('7-SU', 25 * h, [80, 80, 80, 80]), // 01:00 the next morning: night
      '17-0705,07:05:00,07:05:00,S1,1', '17-0705,07:08:00,07:08:00,S3,2', '17-0705,07:11:00,07:11:00,S5,3',
      // Starts at a stop 2.2 km off the corridor's street: not a corridor stop.
      '17-0805,08:00:00,08:00:00,FAR,1', '17-0805,08:05:00,08:05:00,S1,2', '17-0805,08:08:00,08:08:00,S3,3', '17-0805,08:11:00,08:11:00,S5,4',
      '7-W,07:10:00,07:10:00,W5,1', '7-W,07:20:00,07:20:00,W1,2',
    ].join('\n') + '\n',
    // Twelve runs of the 7-AM template: 07:00, 07:10, ... 08:50.
    'frequencies.txt': 'trip_id,start_time,end_time,headway_secs,exact_times\n7-AM,07:00:00,09:00:00,600,1\n',
  }
}

/** Uploads the feed as the planner through the real import and returns its id. */
export async function importCorridorFeed(t: TestApp, files: FeedFiles = corridorFeed()): Promise<number> {
  const agent = await t.as('planner')
  const res = await agent.post('/api/feeds').attach('file', zipFeed(files), 'corridor-feed.zip').expect(202)
  const job = await waitForJob(agent, res.body.jobId)
  if (job.state !== 'succeeded') throw new Error(`feed import failed: ${JSON.stringify(job)}`)
  return res.body.feedId
}

/** Metres along a parallel of latitude 51.0 for a longitude difference (IUGG mean sphere). */
export const metresAlong = (dLon: number) => 6_371_008.8 * Math.cos((LAT * Math.PI) / 180) * (dLon * Math.PI / 180)

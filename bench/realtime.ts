// npm run bench:realtime - decode and ingest a day of GTFS-realtime: one VehiclePositions snapshot
// every 30 s (2880) with 200 vehicles each, into a fresh on-disk PGlite through the real intake
// (decode, validate, match to the feed's trips, one transaction per snapshot with COPY).
// Target: the day in under 60 s.
//
// The feed behind it is synthetic: one 12 km route with 25 stops, 200 buses each running 24
// one-hour trips back to back (4800 trips), every day of 2026. Building it and the snapshots is
// not timed.
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import path from 'node:path'
import { zipSync, strToU8 } from 'fflate'
import { sql } from 'drizzle-orm'
import { openDatabase } from '../server/db'
import { organisations } from '../server/db/schema'
import { DEMO_ORGANISATIONS } from '../server/seed/demo-people'
import { importFeedFromFile } from '../server/services/gtfs/import'
import { ingestBatch } from '../server/services/realtime/ingest'
import { encodeVehicleFeed, type VehicleToEncode } from '../server/services/realtime/encode'
import { buildShapeLine, pointAt } from '../server/services/realtime/shape-line'
import { formatGtfsTime } from '../shared/gtfs/time'

const VEHICLES = 200
const SNAPSHOTS = 2880
const STEP_S = 30
const STOPS = 25
const TRIP_S = 3600
const DAY = '20260615'
const DAY_START = Date.UTC(2026, 5, 15) / 1000 // the feed's agency is on UTC
const TARGET_S = 60

// An invented street running north-east.
const shapePts = Array.from({ length: 121 }, (_, i) => ({ lat: 10 + i * 0.0007, lon: 20 + i * 0.0006 }))
const line = buildShapeLine(shapePts)
const stopDist = Array.from({ length: STOPS }, (_, i) => (line.lengthM * i) / (STOPS - 1))
const offsetOf = (v: number) => Math.round((v * TRIP_S) / VEHICLES)

function feedZip(): Uint8Array {
  const stops = stopDist.map((d, i) => { const p = pointAt(line, d); return `S${i},Stop ${i},${p.lat.toFixed(6)},${p.lon.toFixed(6)}` })
  const trips: string[] = []
  const stopTimes: string[] = []
  for (let v = 0; v < VEHICLES; v++) {
    for (let k = 0; k < 24; k++) {
      const id = `T${v}-${k}`
      trips.push(`R1,ALL,${id},0,SH1`)
      const start = offsetOf(v) + k * TRIP_S
      stopDist.forEach((_, i) => {
        const t = formatGtfsTime(start + Math.round(((TRIP_S - 60) * i) / (STOPS - 1)))
        stopTimes.push(`${id},${t},${t},S${i},${i + 1}`)
      })
    }
  }
  const files = {
    'agency.txt': 'agency_id,agency_name,agency_url,agency_timezone\nBA,Bench Transit,https://bench.test/,UTC\n',
    'stops.txt': ['stop_id,stop_name,stop_lat,stop_lon', ...stops].join('\n') + '\n',
    'routes.txt': 'route_id,agency_id,route_short_name,route_type\nR1,BA,1,3\n',
    'calendar.txt': 'service_id,monday,tuesday,wednesday,thursday,friday,saturday,sunday,start_date,end_date\nALL,1,1,1,1,1,1,1,20260101,20261231\n',
    'shapes.txt': ['shape_id,shape_pt_lat,shape_pt_lon,shape_pt_sequence', ...shapePts.map((p, i) => `SH1,${p.lat.toFixed(6)},${p.lon.toFixed(6)},${i + 1}`)].join('\n') + '\n',
    'trips.txt': ['route_id,service_id,trip_id,direction_id,shape_id', ...trips].join('\n') + '\n',
    'stop_times.txt': ['trip_id,arrival_time,departure_time,stop_id,stop_sequence', ...stopTimes].join('\n') + '\n',
  }
  return zipSync(Object.fromEntries(Object.entries(files).map(([k, t]) => [k, strToU8(t)])))
}

function snapshot(i: number): Uint8Array {
  const T = DAY_START + i * STEP_S
  const vehicles: VehicleToEncode[] = []
  for (let v = 0; v < VEHICLES; v++) {
    const since = T - DAY_START - offsetOf(v)
    // Before its first trip a bus waits at the first stop, reported on that trip.
    const k = Math.max(0, Math.min(23, Math.floor(since / TRIP_S)))
    const into = Math.max(0, Math.min(TRIP_S - 60, since - k * TRIP_S))
    const p = pointAt(line, (line.lengthM * into) / (TRIP_S - 60))
    vehicles.push({ entityId: `v${v}`, tripId: `T${v}-${k}`, startDate: DAY, vehicleId: `bus-${v}`, timeS: T - 3, lat: p.lat, lon: p.lon, speedMps: 8 })
  }
  return encodeVehicleFeed(T, vehicles)
}

const work = mkdtempSync(path.join(tmpdir(), 'fanlight-bench-realtime-'))
try {
  console.log('Building the synthetic feed and a fresh data directory...')
  const zipPath = path.join(work, 'feed.zip')
  writeFileSync(zipPath, feedZip())
  const database = await openDatabase(path.join(work, 'pglite'))
  await database.db.insert(organisations).values({ ...DEMO_ORGANISATIONS[0] })
  const feed = await importFeedFromFile(database.db, { organisationId: DEMO_ORGANISATIONS[0].id, userId: null, name: 'bench', path: zipPath })
  console.log(`  feed ${feed.feedId}: ${feed.counts.trips} trips, ${feed.counts.stop_times} stop times`)

  console.log(`Encoding ${SNAPSHOTS} snapshots of ${VEHICLES} vehicles...`)
  const files = Array.from({ length: SNAPSHOTS }, (_, i) => ({ name: `snap-${String(i).padStart(4, '0')}.pb`, data: snapshot(i) }))
  const bytes = files.reduce((s, f) => s + f.data.length, 0)
  console.log(`  ${(bytes / 1024 / 1024).toFixed(1)} MB of FeedMessages`)

  const clock = { now: () => new Date((DAY_START + 86_400 + 3600) * 1000) }
  const t0 = performance.now()
  const { summary } = await ingestBatch({ db: database.db, clock, feedVersionId: feed.feedId }, files)
  const seconds = (performance.now() - t0) / 1000

  const rows = Number((await database.db.execute<{ n: number }>(sql`select count(*)::int as n from realtime_vehicle_observations`)).rows[0].n)
  await database.close()
  if (summary.stored !== SNAPSHOTS || summary.unmatched !== 0 || rows !== SNAPSHOTS * VEHICLES) {
    throw new Error(`unexpected result: ${JSON.stringify(summary)}, ${rows} rows`)
  }
  const entities = SNAPSHOTS * VEHICLES
  console.log(`Ingested ${SNAPSHOTS} snapshots, ${entities} entities (${rows} rows) in ${seconds.toFixed(1)} s`)
  console.log(`  ${(SNAPSHOTS / seconds).toFixed(0)} snapshots/s, ${Math.round(entities / seconds)} entities/s`)
  console.log(`  target: a day in < ${TARGET_S} s -> ${seconds < TARGET_S ? 'met' : 'NOT met'}`)
  if (seconds >= TARGET_S) process.exitCode = 1
} finally {
  rmSync(work, { recursive: true, force: true })
}

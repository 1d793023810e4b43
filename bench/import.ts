// npm run bench:import - the GTFS import on a synthetic feed of about a million stop_times.
// A child process writes the feed and creates a fresh on-disk data directory (PGlite's first
// start is memory-hungry and not part of an import); this process then opens it, imports the
// feed through the real service and, as the reference, times a plain COPY of the same
// stop_times.txt into an empty table. Targets: import <= 3x the raw COPY, peak memory < 1.5 GB.
import { spawnSync } from 'node:child_process'
import { mkdtempSync, readFileSync, rmSync, statSync } from 'node:fs'
import { tmpdir } from 'node:os'
import path from 'node:path'
import { fileURLToPath } from 'node:url'
import { Worker } from 'node:worker_threads'
import { openDatabase } from '../server/db'
import { organisations } from '../server/db/schema'
import { DEMO_ORGANISATIONS } from '../server/seed/demo-people'
import { importFeedFromFile } from '../server/services/gtfs/import'
import { MILLION_STOP_TIMES, writeSyntheticFeed } from './synthetic-feed'

const here = fileURLToPath(import.meta.url)

if (process.argv[2] === '--prepare') {
  const [dir] = process.argv.slice(3)
  const made = await writeSyntheticFeed(path.join(dir, 'feed.zip'), MILLION_STOP_TIMES, path.join(dir, 'stop_times.txt'))
  const database = await openDatabase(path.join(dir, 'pglite'))
  await database.db.insert(organisations).values({ ...DEMO_ORGANISATIONS[0] })
  await database.close()
  console.log(JSON.stringify(made))
  process.exit(0)
}

/** Peak resident memory of this process (kernel high-water mark), in bytes. */
const peakRss = () => Number(/VmHWM:\s+(\d+) kB/.exec(readFileSync('/proc/self/status', 'utf8'))![1]) * 1024
const mb = (b: number) => `${Math.round(b / 1024 / 1024)} MB`

const work = mkdtempSync(path.join(tmpdir(), 'fanlight-bench-import-'))
try {
  console.log('Writing the synthetic feed and a fresh data directory (child process)...')
  const prep = spawnSync(process.execPath, ['--import', 'tsx', here, '--prepare', work], { encoding: 'utf8', stdio: ['ignore', 'pipe', 'inherit'] })
  if (prep.status !== 0) throw new Error('prepare step failed')
  const made = JSON.parse(prep.stdout.trim().split('\n').pop()!) as { stopTimes: number; trips: number; shapePoints: number }
  const zipBytes = statSync(path.join(work, 'feed.zip')).size
  console.log(`  ${made.stopTimes} stop_times, ${made.trips} trips, ${made.shapePoints} shape points; zip ${mb(zipBytes)}`)

  // Sampled from a worker thread, whose timer runs while the main thread is busy in COPY.
  const sampler = new Worker(`
    const { parentPort } = require('node:worker_threads')
    let max = 0
    const t = setInterval(() => { max = Math.max(max, process.memoryUsage.rss()) }, 10)
    parentPort.on('message', () => { clearInterval(t); parentPort.postMessage(max) })
  `, { eval: true })

  const database = await openDatabase(path.join(work, 'pglite'))
  const rssOpen = process.memoryUsage.rss()
  const stages: { stage: string; at: number }[] = []
  const t0 = performance.now()
  const result = await importFeedFromFile(database.db, {
    organisationId: DEMO_ORGANISATIONS[0].id, userId: null, name: 'synthetic', path: path.join(work, 'feed.zip'),
  }, async (p) => { if (p.stage && stages.at(-1)?.stage !== p.stage) stages.push({ stage: p.stage, at: performance.now() }) })
  const importS = (performance.now() - t0) / 1000
  const importPeak = peakRss()
  const writingAt = stages.find((s) => s.stage === 'writing to the database')?.at ?? t0
  const sampledPeak = await new Promise<number>((resolve) => { sampler.once('message', resolve); sampler.postMessage('stop') })
  await sampler.terminate()

  // Reference: stop_times.txt as published, one COPY into an empty table of matching columns.
  await database.client.exec(`CREATE TABLE bench_raw_stop_times (trip_id text, arrival_time text, departure_time text, stop_id text,
    stop_sequence integer, pickup_type smallint, drop_off_type smallint, shape_dist_traveled double precision, timepoint smallint)`)
  const csvBlob = new Blob([readFileSync(path.join(work, 'stop_times.txt'))])
  const t1 = performance.now()
  await database.client.query(`COPY bench_raw_stop_times FROM '/dev/blob' WITH (FORMAT csv, HEADER true)`, [], { blob: csvBlob })
  const copyS = (performance.now() - t1) / 1000
  const { rows } = await database.client.query<{ n: number }>('SELECT count(*)::int AS n FROM bench_raw_stop_times')
  // A second reference with the keys the feed tables carry, built the fastest way (after COPY).
  const t2 = performance.now()
  await database.client.exec(`SET maintenance_work_mem = '128MB'; ALTER TABLE bench_raw_stop_times ADD PRIMARY KEY (trip_id, stop_sequence);
    CREATE INDEX ON bench_raw_stop_times (stop_id)`)
  const keyedS = copyS + (performance.now() - t2) / 1000
  await database.client.exec('DROP TABLE bench_raw_stop_times')
  await database.close()

  const c = result.counts
  const allRows = Object.values(c).reduce((s, n) => s + n, 0) + result.derived.serviceDates + result.derived.frequencyTrips
  const ratio = importS / copyS
  console.log('')
  console.log(`import (validated, derived, stored)  ${importS.toFixed(2)} s   ${Math.round(c.stop_times / importS).toLocaleString('en')} stop_times/s, ${Math.round(allRows / importS).toLocaleString('en')} rows/s of all tables`)
  console.log(`  reading and checking              ${((writingAt - t0) / 1000).toFixed(2)} s`)
  console.log(`  one transaction: COPY + attach    ${((t0 + importS * 1000 - writingAt) / 1000).toFixed(2)} s`)
  console.log(`  interpolated stop times           ${result.derived.interpolatedStopTimes.toLocaleString('en')}; service dates ${result.derived.serviceDates}; warnings ${result.warningCount}`)
  console.log(`raw COPY of stop_times.txt          ${copyS.toFixed(2)} s   ${Math.round(rows[0].n / copyS).toLocaleString('en')} rows/s`)
  console.log(`  + its two indexes built after      ${keyedS.toFixed(2)} s`)
  console.log(`ratio import / raw COPY             ${ratio.toFixed(2)}x   (target <= 3x: ${ratio <= 3 ? 'met' : 'NOT met'})`)
  console.log(`ratio import / raw COPY + indexes   ${(importS / keyedS).toFixed(2)}x`)
  console.log(`peak memory (RSS)                   ${mb(Math.max(importPeak, sampledPeak))} (kernel high-water ${mb(importPeak)}, sampled ${mb(sampledPeak)}; ${mb(rssOpen)} after opening the database)  (target < 1536 MB: ${Math.max(importPeak, sampledPeak) < 1536 * 1024 * 1024 ? 'met' : 'NOT met'})`)
} finally {
  rmSync(work, { recursive: true, force: true })
}

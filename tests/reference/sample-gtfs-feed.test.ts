// Outside conformance fixture: the npm package `sample-gtfs-feed` (ISC licence), an imaginary
// GTFS Schedule data set published for testing importers. Its own gtfs.zip goes through the real
// import into a real PGlite; the expectations are read from, or worked by hand from, its gtfs/
// folder (frequencies, calendar_dates exceptions, blank times, times past midnight).
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { createRequire } from 'node:module'
import { readFileSync } from 'node:fs'
import path from 'node:path'
import Papa from 'papaparse'
import { openDatabase, type Database } from '../../server/db'
import { seedDemo } from '../../server/seed/demo'
import { importFeedFromFile, type ImportResult } from '../../server/services/gtfs/import'
import { cumulativeDistanceM } from '../../shared/gtfs/geo'
import { parseGtfsTime } from '../../shared/gtfs/time'

const require = createRequire(import.meta.url)
const zipPath = require.resolve('sample-gtfs-feed/gtfs.zip')
const folder = path.dirname(require.resolve('sample-gtfs-feed/gtfs/agency.txt'))
const rowsOf = (file: string) =>
  Papa.parse<Record<string, string>>(readFileSync(path.join(folder, file), 'utf8'), { header: true, skipEmptyLines: true }).data

let database: Database
let result: ImportResult
const q = async <T>(sql: string, params: unknown[] = []) => (await database.client.query<T>(sql, params)).rows

beforeAll(async () => {
  database = await openDatabase('memory')
  await seedDemo(database.db, { password: 'reference-only' })
  result = await importFeedFromFile(database.db, { organisationId: 'org-lindenmere', userId: null, name: 'sample-gtfs-feed', path: zipPath })
}, 60_000)
afterAll(async () => { await database?.close() })

describe('sample-gtfs-feed through the import', () => {
  it('imports without errors and counts every row of its files', () => {
    expect(result.errorCount).toBe(0)
    expect(result.counts).toEqual({
      agency: rowsOf('agency.txt').length,
      routes: rowsOf('routes.txt').length,
      trips: rowsOf('trips.txt').length,
      stops: rowsOf('stops.txt').length,
      stop_times: rowsOf('stop_times.txt').length,
      shapes: rowsOf('shapes.txt').length,
      calendar: rowsOf('calendar.txt').length,
      calendar_dates: rowsOf('calendar_dates.txt').length,
      frequencies: rowsOf('frequencies.txt').length,
    })
    expect(result.counts.stop_times).toBe(29)
  })

  it('derives the service dates of calendar.txt with the exceptions of calendar_dates.txt', async () => {
    const dates = await q<{ service_id: string; n: number; first: string; last: string }>(
      `select service_id, count(*)::int as n, min(date)::text as first, max(date)::text as last
       from gtfs_service_dates where feed_version_id = $1 group by service_id order by service_id`, [result.feedId])
    // Worked by hand from the files: all-day runs every day 2019-03-01..2019-08-20 (173 days)
    // less 2019-05-01 and 2019-07-15..21 (8 removed); on-weekends 46 weekend days less 07-20 and
    // 07-21; on-working-days Monday-Saturday 2019-03-08..2019-07-20 (116) less 05-01 and 07-15..19.
    expect(dates).toEqual([
      { service_id: 'all-day', n: 165, first: '2019-03-01', last: '2019-08-20' },
      { service_id: 'during-dst', n: 1, first: '2019-03-30', last: '2019-03-30' },
      { service_id: 'on-weekends', n: 44, first: '2019-03-03', last: '2019-08-10' },
      { service_id: 'on-working-days', n: 110, first: '2019-03-08', last: '2019-07-20' },
    ])
    const on = async (service: string, date: string) =>
      (await q(`select 1 from gtfs_service_dates where feed_version_id = $1 and service_id = $2 and date = $3`, [result.feedId, service, date])).length === 1
    expect(await on('all-day', '2019-05-01')).toBe(false) // exception_type 2
    expect(await on('all-day', '2019-07-18')).toBe(false)
    expect(await on('on-working-days', '2019-07-20')).toBe(true) // the Saturday after the removed week stays
    expect(await on('on-weekends', '2019-07-21')).toBe(false)
    const [feed] = await q<{ service_start: string; service_end: string }>(`select service_start::text, service_end::text from feed_versions where id = $1`, [result.feedId])
    expect(feed).toEqual({ service_start: '2019-03-01', service_end: '2019-08-20' })
  })

  it('expands frequencies.txt: exact_times 1 and frequency-based windows, end excluded', async () => {
    const runs = await q<{ trip_id: string; start_time: number; shift_s: number; exact_times: boolean }>(
      `select trip_id, start_time, shift_s, exact_times from gtfs_frequency_trips where feed_version_id = $1 order by trip_id, start_time`, [result.feedId])
    const freq = rowsOf('frequencies.txt')
    for (const f of freq) {
      const mine = runs.filter((r) => r.trip_id === f.trip_id)
      const start = parseGtfsTime(f.start_time)!, end = parseGtfsTime(f.end_time)!, h = Number(f.headway_secs)
      expect(mine.map((r) => r.start_time)).toEqual(Array.from({ length: Math.ceil((end - start) / h) }, (_, k) => start + k * h))
      expect(mine.every((r) => r.exact_times === (f.exact_times === '1'))).toBe(true)
    }
    // 08:00-08:59 every 300 s: twelve runs, the last at 08:55; 15:00-16:00 every 600 s: six.
    expect(runs.filter((r) => r.trip_id === 'b-downtown-on-working-days')).toHaveLength(12)
    expect(runs.filter((r) => r.trip_id === 'b-outbound-on-working-days')).toHaveLength(6)
    // The template b-downtown-on-working-days first departs 13:14:00; a run starting 08:00 is shifted by the difference.
    expect(runs[0]).toMatchObject({ trip_id: 'b-downtown-on-working-days', start_time: 8 * 3600, shift_s: 8 * 3600 - parseGtfsTime('13:14:00')! })
  })

  it('keeps every given time, fills a blank arrival or departure from the other, and reads times past midnight', async () => {
    const stored = await q<{ trip_id: string; stop_sequence: number; arrival_time: number; departure_time: number; interpolated: boolean }>(
      `select trip_id, stop_sequence, arrival_time, departure_time, interpolated from gtfs_stop_times where feed_version_id = $1`, [result.feedId])
    const byKey = new Map(stored.map((s) => [`${s.trip_id}/${s.stop_sequence}`, s]))
    for (const r of rowsOf('stop_times.txt')) {
      const s = byKey.get(`${r.trip_id}/${r.stop_sequence}`)!
      const arr = r.arrival_time ? parseGtfsTime(r.arrival_time)! : null
      const dep = r.departure_time ? parseGtfsTime(r.departure_time)! : null
      // Where the file leaves one of the two blank (c-outbound-*), the other is used.
      expect(s.arrival_time).toBe(arr ?? dep)
      expect(s.departure_time).toBe(dep ?? arr)
      expect(s.interpolated).toBe(false)
    }
    expect(byKey.get('c-outbound-all-day/1')).toMatchObject({ arrival_time: parseGtfsTime('19:20:00'), departure_time: parseGtfsTime('19:20:00') })
    expect(byKey.get('during-dst-1/0')).toMatchObject({ arrival_time: 25 * 3600 + 55 * 60, departure_time: 25 * 3600 + 58 * 60 })
  })

  it('measures its shapes within 0.5% of the shape_dist_traveled it publishes (metres)', async () => {
    for (const shapeId of ['a-downtown-all-day-s0', 'a-outbound-all-day-s0']) {
      const pts = rowsOf('shapes.txt').filter((p) => p.shape_id === shapeId).sort((a, b) => Number(a.shape_pt_sequence) - Number(b.shape_pt_sequence))
      const measured = cumulativeDistanceM(pts.map((p) => Number(p.shape_pt_lat)), pts.map((p) => Number(p.shape_pt_lon)))
      const published = Number(pts[pts.length - 1].shape_dist_traveled)
      expect(Math.abs(measured[measured.length - 1] / published - 1)).toBeLessThan(0.005)
      // Recognised as metres, so the stored distances are the published ones.
      const [last] = await q<{ dist_m: number }>(
        `select dist_m from gtfs_shapes where feed_version_id = $1 and shape_id = $2 order by shape_pt_sequence desc limit 1`, [result.feedId, shapeId])
      expect(last.dist_m).toBeCloseTo(published, 1)
    }
  })
})

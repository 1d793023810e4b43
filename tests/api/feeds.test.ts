import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import request from 'supertest'
import { mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import path from 'node:path'
import { zipSync, strToU8 } from 'fflate'
import { startTestApp, waitForJob, type TestApp } from '../support/test-app'
import { minimalFeed, zipFeed, type FeedFiles } from '../support/gtfs-fixtures'
import { writeSyntheticFeed } from '../../bench/synthetic-feed'
import { GTFS_TABLES } from '../../server/db/tables/gtfs'
import { haversineM } from '../../shared/gtfs/geo'
import { DEMO_FEED_NAME, seedDemoFeed } from '../../server/seed/demo-feed'

let t: TestApp
beforeAll(async () => { t = await startTestApp() })
afterAll(async () => { await t?.close() })

type Agent = Awaited<ReturnType<TestApp['as']>>
const upload = (agent: Agent, body: Buffer, name = 'feed.zip') => agent.post('/api/feeds').attach('file', body, name)

async function importOf(agent: Agent, body: Buffer) {
  const res = await upload(agent, body).expect(202)
  const job = await waitForJob(agent, res.body.jobId)
  const feed = (await agent.get(`/api/feeds/${res.body.feedId}`).expect(200)).body
  return { feedId: res.body.feedId as number, job, feed }
}

/** Rows of the feed in every GTFS table, and partitions made for it. */
async function leftOf(app: TestApp, feedId: number) {
  let rows = 0
  for (const table of GTFS_TABLES) {
    const r = await app.database.client.query<{ n: number }>(`select count(*)::int as n from ${table} where feed_version_id = $1`, [feedId])
    rows += r.rows[0].n
  }
  const parts = await app.database.client.query<{ n: number }>(`select count(*)::int as n from pg_class where relname like $1`, [`gtfs\\_%\\_f${feedId}`])
  return { rows, partitions: parts.rows[0].n }
}

const q = async <T>(sql: string, params: unknown[] = []) => (await t.database.client.query<T>(sql, params)).rows

describe('POST /api/feeds and the import job', () => {
  let feedId: number

  it('imports a valid feed: 202, job stages to success, counts, service range, empty report', async () => {
    const planner = await t.as('planner')
    const res = await upload(planner, zipFeed(minimalFeed()), 'test-line.zip').expect(202)
    expect(res.body).toEqual({ feedId: expect.any(Number), jobId: expect.any(String) })
    feedId = res.body.feedId
    const job = await waitForJob(planner, res.body.jobId)
    expect(job).toMatchObject({ kind: 'gtfs-import', state: 'succeeded', progress: 1, result: { feedId, errorCount: 0 } })
    const feed = (await planner.get(`/api/feeds/${feedId}`).expect(200)).body
    expect(feed).toMatchObject({
      id: feedId, name: 'test-line.zip', state: 'ready', uploadedBy: { id: 'user-planner' },
      counts: { agency: 1, routes: 1, trips: 2, stops: 4, stop_times: 8, shapes: 4, calendar: 1, calendar_dates: 2, frequencies: 1 },
      derived: { serviceDates: 10, frequencyTrips: 3, interpolatedStopTimes: 2 },
      serviceStart: '2026-01-05', serviceEnd: '2026-01-16',
      report: { errors: [], warnings: [], errorCount: 0, warningCount: 0 },
    })
  })

  it('derives service dates from calendar.txt and calendar_dates.txt', async () => {
    const dates = await q<{ date: string }>(`select date::text from gtfs_service_dates where feed_version_id = $1 order by date`, [feedId])
    // Weekdays 5-16 January 2026, less Wednesday the 7th (exception 2), plus Saturday the 10th (exception 1).
    expect(dates.map((d) => d.date)).toEqual([
      '2026-01-05', '2026-01-06', '2026-01-08', '2026-01-09', '2026-01-10',
      '2026-01-12', '2026-01-13', '2026-01-14', '2026-01-15', '2026-01-16',
    ])
  })

  it('interpolates blank times by distance along the shape and keeps times past midnight', async () => {
    const rows = await q<{ trip_id: string; stop_id: string; arrival_time: number; departure_time: number; interpolated: boolean; dist_m: number }>(
      `select trip_id, stop_id, arrival_time, departure_time, interpolated, dist_m from gtfs_stop_times where feed_version_id = $1 order by trip_id, stop_sequence`, [feedId])
    const t1 = rows.filter((r) => r.trip_id === 'T1')
    // Four stops evenly spaced on a straight shape, 08:00:00 to 08:09:00: 08:03:00 and 08:06:00.
    expect(t1.map((r) => r.arrival_time)).toEqual([28_800, 28_980, 29_160, 29_340])
    expect(t1.map((r) => r.interpolated)).toEqual([false, true, true, false])
    const leg = haversineM(47.6, 8.9, 47.6, 8.91)
    expect(t1[1].dist_m).toBeCloseTo(leg, 0)
    expect(t1[3].dist_m).toBeCloseTo(haversineM(47.6, 8.9, 47.6, 8.93), 0)
    const t2 = rows.filter((r) => r.trip_id === 'T2')
    expect(t2[0].departure_time).toBe(24 * 3600 + 50 * 60)
    expect(t2[3].arrival_time).toBe(25 * 3600)
  })

  it('expands frequencies.txt into runs shifted from the template', async () => {
    const runs = await q<{ start_time: number; shift_s: number; exact_times: boolean }>(
      `select start_time, shift_s, exact_times from gtfs_frequency_trips where feed_version_id = $1 order by start_time`, [feedId])
    // 18:00-19:00 every 1200 s: 18:00, 18:20, 18:40 (end excluded); T1 first departs 08:00.
    expect(runs).toEqual([0, 1200, 2400].map((d) => ({ start_time: 18 * 3600 + d, shift_s: 10 * 3600 + d, exact_times: true })))
  })

  it('lists routes with directions, trip counts and shapes', async () => {
    const planner = await t.as('planner')
    const routes = (await planner.get(`/api/feeds/${feedId}/routes`).expect(200)).body
    expect(routes).toEqual([{
      routeId: 'R1', agencyId: 'TA', shortName: '1', longName: 'Test Line', type: 3, color: null, textColor: null, tripCount: 2,
      directions: [{ directionId: 0, tripCount: 2, expandedTripCount: 4, headsigns: [], shapes: [{ shapeId: 'SH1', tripCount: 2 }] }],
    }])
  })

  it('serves a shape with the distance of each point', async () => {
    const manager = await t.as('manager')
    const shape = (await manager.get(`/api/feeds/${feedId}/shapes/SH1`).expect(200)).body
    expect(shape.points.map((p: { sequence: number }) => p.sequence)).toEqual([1, 2, 3, 4])
    expect(shape.points[0].distM).toBe(0)
    expect(shape.lengthM).toBeCloseTo(haversineM(47.6, 8.9, 47.6, 8.93), 0)
    await manager.get(`/api/feeds/${feedId}/shapes/NOPE`).expect(404)
  })

  it('lists feed versions for planner, manager and admin with uploader, dates and state', async () => {
    for (const who of ['planner', 'manager', 'admin'] as const) {
      const list = (await (await t.as(who)).get('/api/feeds').expect(200)).body
      expect(list.find((f: { id: number }) => f.id === feedId)).toMatchObject({
        name: 'test-line.zip', state: 'ready', uploadedBy: { name: 'Tova Rasmussen' }, serviceStart: '2026-01-05', serviceEnd: '2026-01-16',
      })
    }
  })

  it('admin may upload too', async () => {
    const admin = await t.as('admin')
    const { job } = await importOf(admin, zipFeed(minimalFeed()))
    expect(job.state).toBe('succeeded')
  })
})

describe('roles and bad requests', () => {
  it('refuses uploads from engineers and managers (403) and anonymous callers (401)', async () => {
    const body = zipFeed(minimalFeed())
    await upload(await t.as('engineer'), body).expect(403)
    await upload(await t.as('manager'), body).expect(403)
    await request(t.app).post('/api/feeds').attach('file', body, 'feed.zip').expect(401)
  })

  it('lets engineers read no feeds and managers delete none', async () => {
    await (await t.as('engineer')).get('/api/feeds').expect(403)
    const [any] = (await (await t.as('planner')).get('/api/feeds').expect(200)).body
    await (await t.as('engineer')).get(`/api/feeds/${any.id}`).expect(403)
    await (await t.as('engineer')).get(`/api/feeds/${any.id}/routes`).expect(403)
    await (await t.as('manager')).delete(`/api/feeds/${any.id}`).expect(403)
    await request(t.app).get('/api/feeds').expect(401)
  })

  it('answers 404 for unknown feeds and 422 for a malformed id', async () => {
    const planner = await t.as('planner')
    await planner.get('/api/feeds/987654').expect(404)
    await planner.get('/api/feeds/987654/routes').expect(404)
    await planner.delete('/api/feeds/987654').expect(404)
    const res = await planner.get('/api/feeds/abc').expect(422)
    expect(res.body.issues[0].path).toEqual(['id'])
  })

  it('needs the file field and refuses unknown fields', async () => {
    const planner = await t.as('planner')
    const none = await planner.post('/api/feeds').field('name', 'no file').expect(422)
    expect(none.body.issues[0].path).toEqual(['file'])
    const scratch = path.join(tmpdir(), 'fanlight-uploads')
    const before = new Set(readdirSync(scratch))
    const extra = await planner.post('/api/feeds').field('colour', 'red').attach('file', zipFeed(minimalFeed()), 'f.zip').expect(422)
    expect(JSON.stringify(extra.body.issues)).toContain('colour')
    // The refused upload does not stay in the scratch folder.
    await expect.poll(() => readdirSync(scratch).filter((f) => !before.has(f)), { timeout: 10_000 }).toEqual([])
  })
})

describe('bad feeds fail with a clear message, the server keeps serving, nothing of the feed stays', () => {
  const broken = (change: (f: FeedFiles) => void) => { const f = minimalFeed(); change(f); return zipFeed(f) }
  const cases: { name: string; body: () => Buffer; kind: string; message: RegExp }[] = [
    { name: 'not a zip', body: () => Buffer.from('stop_id,stop_name\nS1,Main\n'), kind: 'not_a_zip', message: /not a zip archive/ },
    {
      name: 'an entry with a path outside the archive',
      body: () => Buffer.from(zipSync({ ...Object.fromEntries(Object.entries(minimalFeed()).map(([k, v]) => [k, strToU8(v)])), '../../escape.txt': strToU8('x') })),
      kind: 'path_outside_archive', message: /"\.\.\/\.\.\/escape\.txt" has a path outside the archive/,
    },
    { name: 'a missing required file', body: () => broken((f) => { delete f['trips.txt'] }), kind: 'missing_file', message: /trips\.txt: The feed has no trips\.txt/ },
    {
      name: 'a malformed CSV line (extra field)',
      body: () => broken((f) => { f['stops.txt'] = f['stops.txt'].replace('S2,Second Stop,47.6000,8.9100', 'S2,Second Stop,47.6000,8.9100,oops') }),
      kind: 'malformed_line', message: /stops\.txt line 3.*5 fields; the header has 4/,
    },
    {
      name: 'a malformed CSV line (unclosed quote)',
      body: () => broken((f) => { f['routes.txt'] = 'route_id,agency_id,route_short_name,route_long_name,route_type\nR1,TA,1,"Test Line,3\n' }),
      kind: 'malformed_line', message: /routes\.txt line 2.*not closed/,
    },
    {
      name: 'a wrong type',
      body: () => broken((f) => { f['stops.txt'] = f['stops.txt'].replace('S1,First Stop,47.6000', 'S1,First Stop,north') }),
      kind: 'invalid_value', message: /stops\.txt line 2, field stop_lat \(value 'north'\): Expected a latitude/,
    },
    {
      name: 'a time that is not H:MM:SS',
      body: () => broken((f) => { f['stop_times.txt'] = f['stop_times.txt'].replace('T1,08:09:00,08:09:00', 'T1,8:9:00,08:09:00') }),
      kind: 'invalid_value', message: /stop_times\.txt line 5, field arrival_time \(value '8:9:00'\)/,
    },
    {
      name: 'a dangling reference',
      body: () => broken((f) => { f['stop_times.txt'] += 'T9,09:00:00,09:00:00,S1,1,1\n' }),
      kind: 'dangling_reference', message: /stop_times\.txt line 10, field trip_id \(value 'T9'\): No trip in trips\.txt/,
    },
    {
      name: 'a dangling shape of a trip',
      body: () => broken((f) => { f['trips.txt'] = f['trips.txt'].replace('R1,WK,T2,0,SH1', 'R1,WK,T2,0,SH9') }),
      kind: 'dangling_reference', message: /trips\.txt line 3, field shape_id \(value 'SH9'\)/,
    },
    { name: 'an empty file', body: () => broken((f) => { f['stops.txt'] = '' }), kind: 'empty_file', message: /stops\.txt line 1: The file is empty/ },
    {
      name: 'a required column missing',
      body: () => broken((f) => { f['routes.txt'] = 'route_id,agency_id,route_short_name,route_long_name\nR1,TA,1,Test Line\n' }),
      kind: 'missing_column', message: /routes\.txt line 1, field route_type: The header has no route_type column/,
    },
    {
      name: 'a duplicate key',
      body: () => broken((f) => { f['stops.txt'] += 'S4,Fourth again,47.6,8.94\n' }),
      kind: 'duplicate_key', message: /stops\.txt line 6, field stop_id \(value 'S4'\): The stop_id S4 is defined twice/,
    },
    {
      name: 'a stop_sequence repeated in a trip',
      body: () => broken((f) => { f['stop_times.txt'] = f['stop_times.txt'].replace('T2,24:56:00,24:56:00,S3,3,1', 'T2,24:56:00,24:56:00,S3,2,1') }),
      kind: 'stop_sequence', message: /stop_times\.txt line 8, field stop_sequence \(value '2'\)/,
    },
    {
      name: 'an arrival after the departure',
      body: () => broken((f) => { f['stop_times.txt'] = f['stop_times.txt'].replace('T2,24:53:00,24:53:00', 'T2,24:54:00,24:53:00') }),
      kind: 'time_order', message: /stop_times\.txt line 7, field departure_time \(value '24:53:00'\): departure_time is before arrival_time 24:54:00/,
    },
    {
      name: 'times going backwards along a trip',
      body: () => broken((f) => { f['stop_times.txt'] = f['stop_times.txt'].replace('T2,24:56:00,24:56:00', 'T2,24:52:00,24:52:00') }),
      kind: 'time_order', message: /stop_times\.txt line 8, field arrival_time \(value '24:52:00'\): Times must not decrease/,
    },
  ]

  for (const c of cases) {
    it(`refuses ${c.name}`, async () => {
      const planner = await t.as('planner')
      const { feedId, job, feed } = await importOf(planner, c.body())
      expect(job.state).toBe('failed')
      expect(job.message).toMatch(c.message)
      expect(job.result).toMatchObject({ feedId, errorCount: expect.any(Number) })
      expect(feed.state).toBe('failed')
      expect(feed.report.errorCount).toBeGreaterThan(0)
      expect(feed.report.errors[0]).toMatchObject({ kind: c.kind, severity: 'error' })
      expect(feed.report.errors[0]).toHaveProperty('file')
      expect(feed.report.errors[0]).toHaveProperty('line')
      expect(feed.report.errors[0]).toHaveProperty('field')
      expect(await leftOf(t, feedId)).toEqual({ rows: 0, partitions: 0 })
      await request(t.app).get('/api/health').expect(200)
      await planner.get(`/api/feeds/${feedId}/routes`).expect(404)
    })
  }

  it('keeps only the first findings of a kind in the report, with the true totals', async () => {
    const planner = await t.as('planner')
    const many = Array.from({ length: 80 }, (_, i) => `X${i},08:00:00,08:00:00,S1,1,1`).join('\n')
    const { feed } = await importOf(planner, broken((f) => { f['stop_times.txt'] += `${many}\n` }))
    const dangling = feed.report.kinds.find((k: { kind: string }) => k.kind === 'dangling_reference')
    expect(dangling).toEqual({ kind: 'dangling_reference', severity: 'error', count: 80, kept: 50 })
    expect(feed.report.errorCount).toBe(80)
    expect(feed.report.errors).toHaveLength(50)
  })

  it('reports warnings without blocking the import', async () => {
    const planner = await t.as('planner')
    const { job, feed } = await importOf(planner, broken((f) => { f['stops.txt'] += 'S5,Nobody Stops Here,47.61,8.95\n' }))
    expect(job.state).toBe('succeeded')
    expect(feed.report.warnings).toEqual([expect.objectContaining({ kind: 'unused_stop', file: 'stops.txt', field: 'stop_id', value: 'S5' })])
  })
})

describe('zip bombs, with small caps', () => {
  let small: TestApp
  beforeAll(async () => { small = await startTestApp({ gtfsLimits: { maxUncompressedBytes: 2_000_000, maxEntries: 20 } }) })
  afterAll(async () => { await small?.close() })

  async function refused(body: Buffer, message: RegExp) {
    const planner = await small.as('planner')
    const { feedId, job, feed } = await importOf(planner, body)
    expect(job.state).toBe('failed')
    expect(job.message).toMatch(message)
    expect(feed.state).toBe('failed')
    expect(await leftOf(small, feedId)).toEqual({ rows: 0, partitions: 0 })
    await request(small.app).get('/api/health').expect(200)
  }
  const files = () => Object.fromEntries(Object.entries(minimalFeed()).map(([k, v]) => [k, strToU8(v)]))

  it('refuses an archive that declares more than the cap once inflated', async () => {
    await refused(Buffer.from(zipSync({ ...files(), 'shapes.txt': new Uint8Array(20_000_000) })), /declares \d+ bytes once uncompressed; at most 2000000/)
  })

  it('stops an archive that lies about its sizes while inflating it', async () => {
    const zip = Buffer.from(zipSync({ ...files(), 'shapes.txt': new Uint8Array(20_000_000) }))
    // Rewrite the declared uncompressed size of shapes.txt (local header and directory) to 150 bytes.
    const local = zip.indexOf('shapes.txt') - 30
    zip.writeUInt32LE(150, local + 22)
    const cd = zip.indexOf('shapes.txt', local + 40) - 46
    zip.writeUInt32LE(150, cd + 24)
    await refused(zip, /shapes\.txt inflates to more than the 150 bytes it declares/)
  })

  it('refuses an archive with too many entries', async () => {
    const many = { ...files(), ...Object.fromEntries(Array.from({ length: 20 }, (_, i) => [`extra-${i}.txt`, strToU8('x')])) }
    await refused(Buffer.from(zipSync(many)), /has 29 entries; at most 20/)
  })
})

describe('one import at a time', () => {
  it('answers 409 to a second upload while one runs, then accepts it once done', async () => {
    const dir = mkdtempSync(path.join(tmpdir(), 'fanlight-feeds-test-'))
    try {
      // Big enough (about 90 000 stop_times) that the first import is still running.
      await writeSyntheticFeed(path.join(dir, 'big.zip'), { routes: 12, stopsPerTrip: 36, weekdayTrips: 100 })
      const big = readFileSync(path.join(dir, 'big.zip'))
      const planner = await t.as('planner')
      const first = await upload(planner, big).expect(202)
      const second = await upload(planner, zipFeed(minimalFeed())).expect(409)
      expect(second.body).toMatchObject({ error: 'conflict', jobId: first.body.jobId })
      await request(t.app).get('/api/health').expect(200)
      const job = await waitForJob(planner, first.body.jobId, 120_000)
      expect(job.state).toBe('succeeded')
      expect(job.result.counts.stop_times).toBe(12 * 2 * (100 + 50 + 33) * 36)
      await upload(planner, zipFeed(minimalFeed())).expect(202).then((r) => waitForJob(planner, r.body.jobId))
    } finally {
      rmSync(dir, { recursive: true, force: true })
    }
  })
})

describe('DELETE /api/feeds/:id', () => {
  it('removes the version and every row and partition of it', async () => {
    const planner = await t.as('planner')
    const { feedId, job } = await importOf(planner, zipFeed(minimalFeed()))
    expect(job.state).toBe('succeeded')
    expect((await leftOf(t, feedId)).rows).toBeGreaterThan(0)
    await planner.delete(`/api/feeds/${feedId}`).expect(204)
    await planner.get(`/api/feeds/${feedId}`).expect(404)
    expect(await leftOf(t, feedId)).toEqual({ rows: 0, partitions: 0 })
    expect((await planner.get('/api/feeds').expect(200)).body.some((f: { id: number }) => f.id === feedId)).toBe(false)
  })

  it('refuses (409) to delete a version that corridors use, and keeps all of it', async () => {
    const planner = await t.as('planner')
    const { feedId } = await importOf(planner, zipFeed(minimalFeed()))
    const before = await leftOf(t, feedId)
    await t.database.client.query(
      `insert into corridors (id, agency_id, feed_version_id, name, route_ids, direction_id, shape_id, length_m)
       values ('corridor-feeds-test', 'org-lindenmere', $1, 'Test corridor', '{R1}', 0, 'SH1', 2250)`, [feedId])
    const res = await planner.delete(`/api/feeds/${feedId}`).expect(409)
    expect(res.body.message).toMatch(/Corridors use this feed version/)
    expect(await leftOf(t, feedId)).toEqual(before)
    await planner.get(`/api/feeds/${feedId}/routes`).expect(200)
    await t.database.client.query(`delete from corridors where id = 'corridor-feeds-test'`)
    await planner.delete(`/api/feeds/${feedId}`).expect(204)
  })

  it('lets admin delete a failed version too', async () => {
    const planner = await t.as('planner')
    const { feedId } = await importOf(planner, Buffer.from('not a zip'))
    await (await t.as('admin')).delete(`/api/feeds/${feedId}`).expect(204)
    await planner.get(`/api/feeds/${feedId}`).expect(404)
  })
})

describe('the demo feed', () => {
  it('is seeded once through the real import, and seeding again adds nothing', async () => {
    const planner = await t.as('planner')
    const demo = (await planner.get('/api/feeds').expect(200)).body.filter((f: { name: string }) => f.name === DEMO_FEED_NAME)
    expect(demo).toHaveLength(1)
    expect(demo[0]).toMatchObject({ state: 'ready', errorCount: 0, serviceStart: '2026-09-07', serviceEnd: '2027-09-05' })
    expect(await seedDemoFeed(t.database.db)).toBe(demo[0].id)
    expect((await planner.get('/api/feeds').expect(200)).body.filter((f: { name: string }) => f.name === DEMO_FEED_NAME)).toHaveLength(1)
    const routes = (await planner.get(`/api/feeds/${demo[0].id}/routes`).expect(200)).body
    expect(routes.map((r: { shortName: string; longName: string }) => `${r.shortName} ${r.longName}`))
      .toEqual(['7 Kestrel Avenue', '17 Kestrel Express', '21 Fernhill Circular', '34 Saltmarsh Lane'])
  })

  it('places every signalised intersection of sample-feeds/README.md on the corridor shape, at the distance it states', async () => {
    const [demo] = (await (await t.as('planner')).get('/api/feeds').expect(200)).body.filter((f: { name: string }) => f.name === DEMO_FEED_NAME)
    const readme = readFileSync(new URL('../../sample-feeds/README.md', import.meta.url), 'utf8')
    const rows = readme.split('\n').filter((l) => /^\| \d+ \| (Kestrel Avenue|Harbour Road) & /.test(l)).map((l) => l.split('|').map((c) => c.trim()))
    expect(rows).toHaveLength(10)
    expect(rows.filter((r) => r[3] === 'City of Brackenford')).toHaveLength(6)
    for (const r of rows) {
      const [lat, lon, along] = [Number(r[4]), Number(r[5]), Number(r[6].replace(/ /g, ''))]
      const hit = await q<{ dist_m: number }>(
        `select dist_m from gtfs_shapes where feed_version_id = $1 and shape_id = '7-E' and shape_pt_lat = $2 and shape_pt_lon = $3`, [demo.id, lat, lon])
      expect(hit, r[2]).toHaveLength(1)
      expect(Math.abs(hit[0].dist_m - along)).toBeLessThanOrEqual(0.5)
    }
  })
})

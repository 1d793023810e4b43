import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import request from 'supertest'
import { sql } from 'drizzle-orm'
import { startTestApp, waitForJob, type TestApp } from '../support/test-app'
import {
  dayStartUtc, feedMessage, MONDAY, NOON, REFERENCE_RUN, realtimeCorridor, runSnapshots, runWithWait, vehicleEntity, zipOf,
} from '../support/realtime-fixtures'
import { evaluateApproach } from '../../shared/model/approach'
import { corridorFeed } from '../support/corridor-feed'
import { zipFeed } from '../support/gtfs-fixtures'
import { lonAt } from '../support/realtime-fixtures'
import { readScenarioGtfs } from '../../server/services/realtime/scenario-gtfs'
import { allDayPlan, RealtimeScenario } from '../../server/services/realtime/scenario'
import { startFakeRealtimeFeed, type FakeRealtimeFeed } from '../../server/services/realtime/fake-feed'
import { startRealtimePoller } from '../../server/services/realtime/poller'
import { freePort } from '../support/server-process'
import { approachBody } from '../../shared/schemas/model'

// The app's clock: a week after the last service day of the corridor feed.
const NOW = new Date('2026-01-20T00:00:00Z')
let t: TestApp
let fx: Awaited<ReturnType<typeof realtimeCorridor>>
let dist: Record<string, number>

beforeAll(async () => {
  t = await startTestApp({ clock: { now: () => NOW } })
  fx = await realtimeCorridor(t)
  dist = Object.fromEntries(fx.stops.map((s) => [s.stopId, s.distanceM]))
})
afterAll(async () => { await t?.close() })

const count = async (table: string) => Number((await t.database.db.execute<{ n: number }>(sql.raw(`select count(*)::int as n from ${table}`))).rows[0].n)
async function upload(files: { name: string; data: Uint8Array | Buffer }[], status: number, who: 'planner' | 'admin' = 'planner') {
  let req = (await t.as(who)).post('/api/realtime/snapshots')
  for (const f of files) req = req.attach('files', Buffer.from(f.data), f.name)
  return req.expect(status)
}

describe('POST /api/realtime/snapshots', () => {
  it('stores a zip of snapshots, one snapshot per file with its vehicle row', async () => {
    const res = await upload([{ name: 'monday.zip', data: zipOf(runSnapshots(MONDAY, REFERENCE_RUN)) }], 200)
    expect(res.body.feedVersionId).toBe(fx.feedId)
    expect(res.body.summary).toEqual({ files: 17, stored: 17, duplicates: 0, errors: 0, skipped: 0, unmatched: 0, vehicleRows: 17, stopTimeRows: 0 })
    expect(res.body.results[0]).toMatchObject({ file: `monday.zip/${MONDAY}-7-1200-0000.pb`, status: 'stored', vehicles: 1, unmatched: 0, headerTime: '2026-01-12T12:00:00.000Z' })
    expect(await count('realtime_snapshots')).toBe(17)
    expect(await count('realtime_vehicle_observations')).toBe(17)
  })

  it('ignores and counts duplicates (same header time and content)', async () => {
    const res = await upload(runSnapshots(MONDAY, REFERENCE_RUN).slice(0, 3), 200)
    expect(res.body.summary).toMatchObject({ files: 3, stored: 0, duplicates: 3 })
    expect(res.body.results.map((r: { status: string }) => r.status)).toEqual(['duplicate', 'duplicate', 'duplicate'])
    expect(await count('realtime_snapshots')).toBe(17)
    expect(await count('realtime_vehicle_observations')).toBe(17)
  })

  it('names the problem of each bad file, stores the good ones, and keeps nothing of a bad one', async () => {
    const at = dayStartUtc(MONDAY) + 15 * 3600
    const good = feedMessage(at, [
      vehicleEntity('7-1230', MONDAY, { t: 0, d: 300 }, at),
      vehicleEntity('NO-SUCH-TRIP', MONDAY, { t: 0, d: 300 }, at, 'bus-9'),
      { id: 'no-trip', vehicle: { position: { latitude: 51, longitude: -1.9 }, timestamp: at } },
    ])
    const res = await upload([
      { name: 'a-good.pb', data: good },
      { name: 'b-garbage.pb', data: new TextEncoder().encode('vehicle_id,lat,lon\nbus-1,51,-1.9\n') },
      { name: 'c-truncated.pb', data: good.subarray(0, good.length - 5) },
      { name: 'd-version.pb', data: feedMessage(at, [], '3.0') },
      { name: 'e-future.pb', data: feedMessage(NOW.getTime() / 1000 + 3600, []) },
      { name: 'f-old.pb', data: feedMessage(Date.UTC(2019, 0, 1) / 1000, []) },
      { name: 'g-notes.zip', data: zipOf([{ name: 'readme.txt', data: new TextEncoder().encode('hello') }]) },
    ], 200)
    const byFile = Object.fromEntries(res.body.results.map((r: { file: string }) => [r.file, r]))
    expect(byFile['a-good.pb']).toMatchObject({ status: 'stored', entities: 3, vehicles: 3, vehicleRows: 1, unmatched: 2, unmatchedSample: ['NO-SUCH-TRIP', ''] })
    expect(byFile['b-garbage.pb']).toMatchObject({ status: 'error', error: { code: 'not_feed_message' } })
    expect(byFile['c-truncated.pb']).toMatchObject({ status: 'error', error: { code: 'truncated' } })
    expect(byFile['d-version.pb']).toMatchObject({ status: 'error', error: { code: 'version', field: 'header.gtfs_realtime_version' } })
    expect(byFile['e-future.pb']).toMatchObject({ status: 'error', error: { code: 'future_timestamp', field: 'header.timestamp' } })
    expect(byFile['f-old.pb']).toMatchObject({ status: 'error', error: { code: 'old_timestamp' } })
    expect(byFile['g-notes.zip']).toMatchObject({ status: 'error', error: { code: 'bad_archive' } })
    expect(byFile['g-notes.zip/readme.txt']).toMatchObject({ status: 'skipped' })
    expect(res.body.summary).toMatchObject({ files: 8, stored: 1, errors: 6, skipped: 1, unmatched: 2 })
    expect(await count('realtime_snapshots')).toBe(18)
    const [snap] = (await t.database.db.execute<{ unmatched_count: number; vehicle_count: number }>(sql`
      select unmatched_count, vehicle_count from realtime_snapshots where file_name = 'a-good.pb'`)).rows
    expect(snap).toEqual({ unmatched_count: 2, vehicle_count: 3 })
  })

  it('turns a large batch into a job with the same per-file results', async () => {
    // Trip 7-1230 on Tuesday: 30 snapshots, one every 10 s, each a different position.
    const start = dayStartUtc('20260113') + 12.5 * 3600
    const files = Array.from({ length: 30 }, (_, i) => ({
      name: `tue-${String(i).padStart(2, '0')}.pb`,
      data: feedMessage(start + 10 * i, [vehicleEntity('7-1230', '20260113', { t: 10 * i, d: 100 + 40 * i }, start + 10 * i)]),
    }))
    const agent = await t.as('admin')
    const res = await upload(files, 202, 'admin')
    expect(res.body).toMatchObject({ feedVersionId: fx.feedId, files: 30 })
    const job = await waitForJob(agent, res.body.jobId)
    expect(job.state).toBe('succeeded')
    expect(job.result.summary).toMatchObject({ files: 30, stored: 30, vehicleRows: 30 })
    expect(job.result.results).toHaveLength(30)
  })

  it('is for planners and admins only, needs files, and a known feed version', async () => {
    for (const who of ['engineer', 'manager'] as const) {
      await (await t.as(who)).post('/api/realtime/snapshots').attach('files', Buffer.from(feedMessage(1, [])), 'x.pb').expect(403)
    }
    await request(t.app).post('/api/realtime/snapshots').expect(401)
    const none = await (await t.as('planner')).post('/api/realtime/snapshots').field('feedVersionId', String(fx.feedId)).expect(400)
    expect(none.body.message).toContain('files')
    await (await t.as('planner')).post('/api/realtime/snapshots').field('feedVersionId', '999').attach('files', Buffer.from(feedMessage(1, [])), 'x.pb').expect(404)
    const bad = await (await t.as('planner')).post('/api/realtime/snapshots').field('feedVersionId', 'abc').attach('files', Buffer.from(feedMessage(1, [])), 'x.pb').expect(422)
    expect(bad.body.issues[0].path).toEqual(['feedVersionId'])
  })
})

describe('GET /api/realtime/observations', () => {
  it('derives stop and segment times of the reference run (hand computed)', async () => {
    const res = await (await t.as('engineer')).get(`/api/realtime/observations?corridorId=${fx.corridorId}&from=2026-01-12&to=2026-01-12`).expect(200)
    const body = res.body
    // Segments: approach 1 at 600 m, approach 2 at 1100 m; midpoint 850 m. Upstream 400 m (more than
    // the 150 m check-in + 50 m and the near-side stop 110 m + 50 m) and downstream 150 m, the
    // stretch the proposals' evaluation gives the model, cut at the midpoint:
    // segment 1 = [max(0, 600-400), min(850, 600+150)] = [200, 750]; segment 2 = [max(850, 700), min(length, 1250)] = [850, 1250].
    expect(body.segments.map((s: { fromM: number; toM: number }) => [s.fromM, s.toM])).toEqual([[200, 750], [850, 1250]])
    const trip = body.trips.find((x: { tripId: string }) => x.tripId === '7-1200')
    expect(trip).toMatchObject({ serviceDate: '2026-01-12', dayType: 'weekday', periodId: fx.midday.id, positions: 17, offRoute: 0 })
    const noon = dayStartUtc(MONDAY) + NOON
    // Run: leaves S1 at the last STOPPED_AT there (12:00:20), reaches S5 at 12:07:25: 445 - 20 = 425 s.
    expect(trip.startS).toBe(noon + 20)
    expect(trip.runTimeS).toBe(425)
    const [s1, s2] = trip.segments
    // Segment 1 is entered at the 200 m reading (45 s) and left at the 750 m reading (215 s): 170 s,
    // with the STOPPED_AT readings at S2 at 105 s and 125 s: 20 s of dwell.
    expect(s1).toMatchObject({ approachId: fx.a1.id, enterS: noon + 45, exitS: noon + 215, travelS: 170, dwellS: 20, periodId: fx.midday.id })
    // Segment 2: 850 m at 245 s, 1250 m at 325 s: 80 s; dwell at S3 275 s -> 295 s: 20 s.
    expect(s2).toMatchObject({ approachId: fx.a2.id, travelS: 80, dwellS: 20 })
    // Lateness at the 600 m stop line: crossed between (185 s, 560 m) and (215 s, 750 m):
    // 185 + (600 - 560) / (750 - 560) x 30 = 191.316 s after noon. Scheduled there: between
    // S2 departure 12:02:20 (140 s) and S3 arrival 12:04:00 (240 s), in proportion to distance.
    const sched600 = 140 + ((600 - dist.S2) / (dist.S3 - dist.S2)) * 100
    expect(s1.latenessS).toBeCloseTo(191.316 - sched600, 0)
    // Stops: arrival - scheduled arrival: S2 105 - 120 = -15, S3 275 - 240 = 35, S4 355 - 350 = 5, S5 445 - 480 = -35.
    expect(trip.stops.map((s: { latenessS: number }) => s.latenessS)).toEqual([0, -15, 35, 5, -35])
    expect(trip.stops[1]).toMatchObject({ stopId: 'S2', arrivalS: noon + 105, departureS: noon + 125, scheduledS: noon + 120 })
  })

  it('is read by every role, checks the query, and 404s an unknown corridor', async () => {
    for (const who of ['planner', 'engineer', 'manager', 'admin'] as const) {
      await (await t.as(who)).get(`/api/realtime/observations?corridorId=${fx.corridorId}`).expect(200)
    }
    await request(t.app).get(`/api/realtime/observations?corridorId=${fx.corridorId}`).expect(401)
    const bad = await (await t.as('planner')).get(`/api/realtime/observations?corridorId=${fx.corridorId}&from=12-01-2026&x=1`).expect(422)
    expect(bad.body.issues.map((i: { path: string[] }) => i.path.join('.'))).toEqual(expect.arrayContaining(['from', '']))
    await (await t.as('planner')).get('/api/realtime/observations?corridorId=nope').expect(404)
  })
})

describe('GET /api/realtime/lateness', () => {
  it('gives the lateness at stop-line crossings and the late share for a threshold', async () => {
    const res = await (await t.as('manager')).get(`/api/realtime/lateness?corridorId=${fx.corridorId}&from=2026-01-12&to=2026-01-12&lateThresholdS=20`).expect(200)
    const trip = (await (await t.as('manager')).get(`/api/realtime/observations?corridorId=${fx.corridorId}&from=2026-01-12&to=2026-01-12`)).body.trips[0]
    const values = trip.segments.map((s: { latenessS: number }) => s.latenessS)
    expect(res.body.count).toBe(2)
    // Late share = crossings later than 20 s, out of 2.
    expect(res.body.lateShare).toBe(values.filter((v: number) => v > 20).length / 2)
    expect(res.body.histogram.reduce((n: number, b: { count: number }) => n + b.count, 0)).toBe(2)
    expect(res.body.groups.find((g: { key: string }) => g.key === `approach:${fx.a1.id}`)).toMatchObject({ count: 1, medianS: values[0] })
    await (await t.as('manager')).get(`/api/realtime/lateness?corridorId=${fx.corridorId}&lateThresholdS=-5`).expect(422)
  })
})

describe('GET /api/realtime/before-after', () => {
  it('compares run times of two weeks with medians, p85 and a reproducible bootstrap interval', async () => {
    // Before: Mon 5 - Fri 9 January, waits at the 600 m signal longer by 0, 10, 20, 30, 40 s.
    // After: Mon 12 (the reference run, stored above) to Fri 16, waits shorter by 25, 20, 15, 10 s.
    const before = ['20260105', '20260106', '20260107', '20260108', '20260109']
    const after = ['20260113', '20260114', '20260115', '20260116']
    const files = [
      ...before.flatMap((d, i) => runSnapshots(d, runWithWait(10 * i))),
      // 7-1200 on Tuesday 13th only (the 7-1230 readings of that day are another trip).
      ...after.flatMap((d, i) => runSnapshots(d, runWithWait(-25 + 5 * i))),
    ]
    const res = await upload([{ name: 'weeks.zip', data: zipOf(files) }], 202)
    expect((await waitForJob(await t.as('planner'), res.body.jobId)).result.summary).toMatchObject({ stored: files.length })

    const q = `corridorId=${fx.corridorId}&beforeFrom=2026-01-05&beforeTo=2026-01-09&afterFrom=2026-01-12&afterTo=2026-01-16&dayType=weekday&periodId=${fx.midday.id}`
    const ba = (await (await t.as('manager')).get(`/api/realtime/before-after?${q}`).expect(200)).body
    // Corridor run = 425 s + the change of wait. Before: 425, 435, 445, 455, 465 -> median 445;
    // p85 (definition 7): h = 4 x 0.85 = 3.4 -> 455 + 0.4 x 10 = 459.
    // After: 425 (Mon), 400, 405, 410, 415 -> sorted 400, 405, 410, 415, 425: median 410; p85 = 415 + 0.4 x 10 = 419.
    expect(ba.corridor.before).toEqual({ trips: 5, medianS: 445, p85S: 459 })
    expect(ba.corridor.after).toEqual({ trips: 5, medianS: 410, p85S: 419 })
    expect(ba.corridor.medianChange.change).toBe(-35)
    expect(ba.corridor.p85Change.change).toBeCloseTo(-40, 9)
    for (const c of [ba.corridor.medianChange, ba.corridor.p85Change]) {
      expect(c.low).toBeLessThanOrEqual(c.change)
      expect(c.high).toBeGreaterThanOrEqual(c.change)
    }
    // Segment 1 carries the whole change (170 s + change of wait); segment 2 none (80 s every time).
    // Before: 170, 180, 190, 200, 210 -> 190. After: 170, 145, 150, 155, 160 and the 7-1230 run of
    // Tuesday stored by the job test (40 m every 10 s: 550 m in 137.5 s), which never reached the
    // last stop, so it counts for the segment but not the corridor: median of six = (150 + 155) / 2.
    const [seg1, seg2] = ba.segments
    expect(seg1.before).toMatchObject({ trips: 5, medianS: 190 })
    expect(seg1.after).toMatchObject({ trips: 6, medianS: 152.5 })
    // Segment 2: 80 s in every 7-1200 run, 100 s for that 7-1230 run (400 m at 4 m/s): medians 80 and 80.
    expect(seg2.before).toMatchObject({ trips: 5, medianS: 80 })
    expect(seg2.after).toMatchObject({ trips: 6, medianS: 80 })
    expect(seg2.medianChange.change).toBe(0)
    expect(ba).toMatchObject({ confidenceLevel: 0.95, resamples: 2000 })
    // Seeded: the same question gives the same interval.
    const again = (await (await t.as('planner')).get(`/api/realtime/before-after?${q}`).expect(200)).body
    expect(again).toEqual(ba)
  })

  it('checks the two ranges', async () => {
    const res = await (await t.as('manager')).get(`/api/realtime/before-after?corridorId=${fx.corridorId}&beforeFrom=2026-01-09&beforeTo=2026-01-05&afterFrom=2026-01-12`).expect(422)
    expect(res.body.issues.map((i: { path: string[] }) => i.path.join('.'))).toEqual(expect.arrayContaining(['afterTo']))
  })
})

describe('GET /api/realtime/coverage and /demo-feed', () => {
  it('lists the observed service days of the corridor with their trip counts', async () => {
    const res = await (await t.as('manager')).get(`/api/realtime/coverage?corridorId=${fx.corridorId}`).expect(200)
    const days = Object.fromEntries(res.body.days.map((d: { date: string; trips: number }) => [d.date, d.trips]))
    // Monday 12th: 7-1200 and the 7-1230 position of the bad-file test; Tuesday 13th: 7-1200 and 7-1230.
    expect(days).toMatchObject({ '2026-01-05': 1, '2026-01-09': 1, '2026-01-12': 2, '2026-01-13': 2, '2026-01-16': 1 })
    expect(res.body.days[0]).toMatchObject({ date: '2026-01-05', dayType: 'weekday' })
    await (await t.as('manager')).get('/api/realtime/coverage?corridorId=nope').expect(404)
  })

  it('names no local demo feed when the server process started none', async () => {
    expect((await (await t.as('planner')).get('/api/realtime/demo-feed').expect(200)).body).toEqual({ url: null })
    await (await t.as('engineer')).get('/api/realtime/demo-feed').expect(403)
  })
})

describe('GET /api/realtime/calibration', () => {
  it('sets the observed signal delay beside the model baseline and suggests a volume where they disagree', async () => {
    const res = await (await t.as('engineer')).get(`/api/realtime/calibration?corridorId=${fx.corridorId}&from=2026-01-05&to=2026-01-09`).expect(200)
    const row = res.body.rows.find((r: { approachId: string; periodId: string; dayType: string }) =>
      r.approachId === fx.a1.id && r.periodId === fx.midday.id && r.dayType === 'weekday')
    // Segment 1 = 550 m at 50 km/h (13.889 m/s): free run 39.6 s. Dwell at S2 observed: 20 s;
    // the stopping penalty v/(2a) + v/(2d) with a = d = 1.2 m/s2 (the model's default, TCQSM, from
    // memory): 13.889 / 1.2 = 11.574 s. Travel times 170, 180, 190, 200, 210 -> mean 190 s.
    // Observed delay = 190 - 39.6 - 20 - 11.574 = 118.83 s.
    expect(row).toMatchObject({ trips: 5, segmentLengthM: 550, freeRunS: 39.6, dwellS: 20, dwellFrom: 'observed' })
    expect(row.observedDelayS).toBeCloseTo(190 - 550 / (50 / 3.6) - 20 - (50 / 3.6) / 1.2, 0)
    // The model for the same approach and period: the approach data and the timing plan, no priority.
    // Backward wave speed from 1800 veh/h/lane at 50 km/h and 133 veh/km: w = s v / (v kj - s) = 18.557 km/h.
    const input = approachBody.parse({
      diagram: { kind: 'triangular', freeFlowSpeedKmh: 50, backwardWaveSpeedKmh: (1800 * 50) / (50 * 133 - 1800), jamDensityVehPerKmPerLane: 133 },
      approach: { lengthM: 400, downstreamLengthM: 150, lanes: 2, arrivalFlowVehPerHour: 900 },
      signal: { cycleS: 90, effectiveGreenS: 46, lostTimeS: 12 },
      bus: { cruiseSpeedKmh: 50, stop: { position: 'near-side', distanceM: 600 - dist.S2, dwellS: 20 } },
      priority: { strategy: 'none' },
      crossStreet: { arrivalFlowVehPerHour: 400, saturationFlowVehPerHourPerLane: 1800, lanes: 1, minGreenS: 8, pedWalkS: 7, pedClearanceS: 14 },
    })
    const model = evaluateApproach(input, { phaseStepS: 1 }).bus.baseline.meanDelayS
    expect(row.modelDelayS).toBeCloseTo(model, 0)
    expect(row.differenceS).toBeCloseTo(row.observedDelayS - row.modelDelayS, 0)
    // A 90 s cycle with 44 s of red holds a bus about half the red on average: 119 s is more than
    // even twice the given volume explains, so no volume is suggested, a cause is named.
    expect(row.agrees).toBe(false)
    expect(row.suggestion).toBeNull()
    expect(row.note).toMatch(/longer than even twice the volume/)
    // At the second intersection: 80 s - 400 m at 13.889 m/s (28.8 s) - 20 s dwell at S3 - 11.574 s = 19.6 s,
    // within 5 s (or 25%) of the model: it agrees.
    const second = res.body.rows.find((r: { approachId: string; dayType: string }) => r.approachId === fx.a2.id && r.dayType === 'weekday')
    expect(second.observedDelayS).toBeCloseTo(80 - 400 / (50 / 3.6) - 20 - (50 / 3.6) / 1.2, 0)
    expect(second.agrees).toBe(Math.abs(second.differenceS) <= Math.max(5, 0.25 * second.modelDelayS))
    expect(res.body).toMatchObject({ toleranceS: 5, toleranceShare: 0.25 })
  })
})

describe('realtime sources polled from the local fake feed', () => {
  let fake: FakeRealtimeFeed
  // The fake feed's own clock: Tuesday 13 January, 12:03 (trip 7-1200 is on the street).
  let feedTime = dayStartUtc('20260113') + NOON + 180
  beforeAll(async () => {
    const scenario = new RealtimeScenario(readScenarioGtfs(zipFeed(corridorFeed()), ['7']), {
      seed: 7,
      signals: [
        { name: 'First', lat: 51.0, lon: lonAt(600), plans: [allDayPlan(90, 46, 0)], priority: true },
        { name: 'Second', lat: 51.0, lon: lonAt(1100), plans: [allDayPlan(90, 46, 30)], priority: false },
      ],
      priority: { enabled: false, maxExtensionS: 10, maxEarlyGreenS: 10 },
    })
    fake = await startFakeRealtimeFeed((s) => scenario.feedAt(s), { now: () => new Date(feedTime * 1000) })
  })
  afterAll(async () => { await fake?.close() })

  let sourceId = ''
  it('creates a source for the agency on its latest feed, polls it, and ignores an unchanged feed', async () => {
    const planner = await t.as('planner')
    const created = await planner.post('/api/realtime/sources').send({ name: 'Local feed', url: fake.url, intervalS: 30 }).expect(201)
    expect(created.body).toMatchObject({ organisationId: 'org-lindenmere', feedVersionId: fx.feedId, intervalS: 30, active: true, pollCount: 0, snapshots: 0 })
    sourceId = created.body.id
    const first = await planner.post(`/api/realtime/sources/${sourceId}/poll`).expect(200)
    expect(first.body).toMatchObject({ status: 'stored', unmatched: 0 })
    expect(first.body.vehicles).toBeGreaterThan(0)
    const again = await planner.post(`/api/realtime/sources/${sourceId}/poll`).expect(200)
    expect(again.body.status).toBe('duplicate')
    const list = (await (await t.as('manager')).get('/api/realtime/sources').expect(200)).body
    expect(list.find((x: { id: string }) => x.id === sourceId)).toMatchObject({ pollCount: 2, snapshots: 1, lastOutcome: 'duplicate' })
  })

  it('is polled by the poller at its interval', async () => {
    feedTime += 30
    const poller = startRealtimePoller(t.database.db, { now: () => NOW }, { tickMs: 60_000 })
    try {
      await poller.tick()
      await poller.tick() // not due again within 30 s
    } finally {
      await poller.stop()
    }
    const list = (await (await t.as('planner')).get('/api/realtime/sources').expect(200)).body
    expect(list.find((x: { id: string }) => x.id === sourceId)).toMatchObject({ pollCount: 3, snapshots: 2, lastOutcome: 'stored' })
  })

  it('records a feed that cannot be reached', async () => {
    const planner = await t.as('planner')
    const dead = await planner.post('/api/realtime/sources').send({ name: 'Gone', url: `http://127.0.0.1:${await freePort()}/feed`, intervalS: 60 }).expect(201)
    const res = await planner.post(`/api/realtime/sources/${dead.body.id}/poll`).expect(200)
    expect(res.body).toMatchObject({ status: 'error', error: { code: 'fetch_failed' } })
    const list = (await planner.get('/api/realtime/sources').expect(200)).body
    expect(list.find((x: { id: string }) => x.id === dead.body.id)).toMatchObject({ lastOutcome: 'error', lastMessage: expect.stringMatching(/^Polling failed/) })
    await planner.delete(`/api/realtime/sources/${dead.body.id}`).expect(204)
  })

  it('checks the body, the roles and the owner', async () => {
    const planner = await t.as('planner')
    const bad = await planner.post('/api/realtime/sources').send({ name: '', url: 'ftp://feeds.test/x', intervalS: 5, extra: 1 }).expect(422)
    expect(bad.body.issues.map((i: { path: string[] }) => i.path.join('.'))).toEqual(expect.arrayContaining(['name', 'url', 'intervalS', '']))
    await (await t.as('engineer')).get('/api/realtime/sources').expect(403)
    await (await t.as('manager')).post('/api/realtime/sources').send({ name: 'x', url: fake.url, intervalS: 30 }).expect(403)
    await (await t.as('manager')).delete(`/api/realtime/sources/${sourceId}`).expect(403)
    await planner.delete('/api/realtime/sources/no-such-source').expect(404)
    await planner.post('/api/realtime/sources/no-such-source/poll').expect(404)
    await planner.delete(`/api/realtime/sources/${sourceId}`).expect(204)
    // The snapshots it took stay.
    expect(await count('realtime_snapshots')).toBeGreaterThan(0)
  })
})

// npm run bench:savings - the dashboard of a corridor of 30 signals with about 1,500 trips a
// weekday, from stored results. Set up through the real API on a fresh in-memory database: the
// synthetic feed (bench/savings-feed.ts) imported, 30 signals in two cities, the corridor with
// an approach at each, a proposal evaluated and submitted, a third of the rows agreed and a sixth
// refused. Then GET /api/dashboard?corridorId= is timed: the service alone (server time) and
// over HTTP in the same process. The first request also builds and stores the schedule digest;
// the target (< 200 ms server time) is for the requests after it, which read everything stored.
import { performance } from 'node:perf_hooks'
import { startTestApp, waitForJob } from '../tests/support/test-app'
import { ALL_DAY_PLAN } from '../tests/support/proposal-corridor'
import { dashboard } from '../server/services/savings/dashboard'
import { LAT, SIGNAL_LON, savingsFeed } from './savings-feed'
import type { ProposalDto } from '../shared/schemas/proposals'
import type { DashboardDto } from '../shared/schemas/savings'

const TARGET_MS = 200
const RUNS = 15

const t = await startTestApp()
try {
  const planner = await t.as('planner')
  const { zip, eastboundWeekdayTrips } = savingsFeed()
  console.log(`Importing the synthetic feed (${eastboundWeekdayTrips} eastbound trips on a weekday)...`)
  const upload = await planner.post('/api/feeds').attach('file', zip, 'savings-bench.zip').expect(202)
  const job = await waitForJob(planner, upload.body.jobId, 300_000)
  if (job.state !== 'succeeded') throw new Error(`import failed: ${JSON.stringify(job)}`)
  const feedId = upload.body.feedId as number

  console.log('Placing 30 signals, the corridor and its approaches...')
  const cities = [['engineer', 'org-brackenford'], ['engineer2', 'org-osterfield']] as const
  const signals: string[] = []
  for (const [i, lon] of SIGNAL_LON.entries()) {
    const [who, city] = cities[i < 15 ? 0 : 1]
    const x = await (await t.as(who)).post('/api/intersections')
      .send({ name: `Bench Street & Cross ${i + 1}`, lat: LAT, lon, jurisdictionId: city, crossingDistanceM: 14, plans: [ALL_DAY_PLAN] }).expect(201)
    signals.push(x.body.id)
  }
  const corridor = (await planner.post('/api/corridors').send({ feedId, name: 'Bench Street eastbound', routeIds: ['R1', 'R2', 'R3'], directionId: 0 }).expect(201)).body
  const volumes = corridor.periods.map((p: { id: string }, k: number) => ({ periodId: p.id, volumeVehPerHour: 700 + 60 * k, crossVolumeVehPerHour: 350 }))
  for (const [i, id] of signals.entries()) {
    const stop = i % 3 === 0 ? { stopRelation: 'far-side', stopId: `E${i + 1}`, dwellS: 20 } : {}
    const res = await planner.post(`/api/corridors/${corridor.id}/approaches`).send({ intersectionId: id, lanes: 2, speedLimitKmh: 50, crossLanes: 1, volumes, ...stop })
    if (res.status !== 201) throw new Error(`approach ${i + 1}: ${JSON.stringify(res.body)}`)
  }

  console.log('Evaluating and negotiating the proposal...')
  let p: ProposalDto = (await planner.post('/api/proposals').send({ corridorId: corridor.id, name: 'Bench proposal' }).expect(201)).body
  const ev = await planner.post(`/api/proposals/${p.id}/evaluate`).expect(202)
  const evJob = await waitForJob(planner, ev.body.jobId, 600_000)
  if (evJob.state !== 'succeeded') throw new Error(`evaluation failed: ${JSON.stringify(evJob)}`)
  p = (await planner.post(`/api/proposals/${p.id}/submit`).send({ comment: 'Bench.' }).expect(200)).body
  for (const [i, row] of p.rows.entries()) {
    const decision = i % 3 === 0 ? 'accept' : i % 6 === 1 ? 'reject' : null
    if (!decision) continue
    const who = row.jurisdictionId === 'org-brackenford' ? 'engineer' : 'engineer2'
    await (await t.as(who)).post(`/api/proposals/${p.id}/rows/${row.id}/decision`)
      .send({ decision, comment: decision === 'reject' ? 'Not here.' : '', version: row.version }).expect(200)
  }

  const manager = await t.as('manager')
  const user = (await manager.get('/api/auth/me').expect(200)).body.user
  const actor = { id: user.id, email: user.email, name: user.name, role: user.role, organisationId: user.organisation.id, active: true }
  const query = { corridorId: corridor.id, from: '2026-12-01' }

  const c0 = performance.now()
  const first = await dashboard(t.database.db, actor, query, new Date())
  const coldMs = performance.now() - c0
  const service: number[] = []
  for (let i = 0; i < RUNS; i++) {
    const s = performance.now()
    await dashboard(t.database.db, actor, query, new Date())
    service.push(performance.now() - s)
  }
  const http: number[] = []
  let body: DashboardDto | null = null
  for (let i = 0; i < RUNS; i++) {
    const s = performance.now()
    body = (await manager.get(`/api/dashboard?corridorId=${corridor.id}&from=2026-12-01`).expect(200)).body
    http.push(performance.now() - s)
  }
  const f = body!.corridor!
  const weekday = f.days.find((d) => d.dayType === 'weekday')!
  const sorted = (xs: number[]) => [...xs].sort((a, b) => a - b)
  const median = (xs: number[]) => sorted(xs)[Math.floor(xs.length / 2)]
  console.log('')
  console.log(`Corridor: ${f.intersections.weekday.length} signals, ${weekday.trips.toFixed(0)} trips on an average weekday, `
    + `${f.reliability.length} period reliability figures, ${first.corridor!.status.counts.accepted} rows agreed`)
  console.log(`  agreed ${(weekday.accepted.savingPerTripS / 60).toFixed(2)} min per trip, proposed ${(weekday.proposed.savingPerTripS / 60).toFixed(2)} min; `
    + `${f.annual.proposed.vehicleHours.toFixed(0)} vehicle-hours a year as proposed (${f.annualisation.basis})`)
  console.log(`First request (builds and stores the schedule digest): ${coldMs.toFixed(0)} ms`)
  console.log(`Server time, ${RUNS} requests after it: median ${median(service).toFixed(0)} ms, max ${Math.max(...service).toFixed(0)} ms (target < ${TARGET_MS} ms)`)
  console.log(`Over HTTP in process (JSON of ${(JSON.stringify(body).length / 1024).toFixed(0)} kB): median ${median(http).toFixed(0)} ms`)
  console.log(median(service) < TARGET_MS ? 'OK: under target' : 'ABOVE TARGET')
} finally {
  await t.close()
}

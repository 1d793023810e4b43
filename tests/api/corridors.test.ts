import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import request from 'supertest'
import { startTestApp, type TestApp } from '../support/test-app'
import { importCorridorFeed, metresAlong, SHAPE_7E_START_LON, STOP_LON } from '../support/corridor-feed'

// One database and one imported feed for the whole file (PGlite start and import cost seconds);
// each test makes its own corridors.
let t: TestApp
let feedId: number
beforeAll(async () => {
  t = await startTestApp()
  feedId = await importCorridorFeed(t)
})
afterAll(async () => { await t.close() })

const body = () => ({ feedId, name: 'Main St eastbound', routeIds: ['7', '17'], directionId: 0 })
const paths = (res: request.Response) => (res.body.issues as { path: (string | number)[] }[]).map((i) => i.path.join('.'))
async function corridor(overrides: object = {}) {
  return (await (await t.as('planner')).post('/api/corridors').send({ ...body(), ...overrides }).expect(201)).body
}

describe('POST /api/corridors', () => {
  it('builds the corridor on the shape most trips follow, with its stops in order and their distance along it', async () => {
    const c = await corridor()
    expect(c).toMatchObject({ name: 'Main St eastbound', feedId, directionId: 0, shapeId: 'SH7E', agencyId: 'org-lindenmere', version: 1 })
    expect(c.routes.map((r: { shortName: string }) => r.shortName)).toEqual(['7', '17'])
    // The stop 2.2 km off the street is left out.
    expect(c.stops.map((s: { stopId: string }) => s.stopId)).toEqual(['S1', 'S2', 'S3', 'S4', 'S5'])
    // Distance along the parallel of 51.0 deg from the shape start (spherical Earth, R = 6 371 008.8 m).
    c.stops.forEach((s: { distanceM: number; offsetM: number }, i: number) => {
      expect(s.distanceM).toBeCloseTo(metresAlong(STOP_LON[i] - SHAPE_7E_START_LON), 0)
      expect(s.offsetM).toBeCloseTo(11.1, 0) // 0.0001 deg of latitude
    })
    expect(c.lengthM).toBeCloseTo(metresAlong(0.027), 0)
    expect(c.shape[0]).toMatchObject({ lat: 51, lon: -1.901, distM: 0 })
  })

  it('gives median run times, trips per hour by period and day type, and the hourly profile', async () => {
    const c = await corridor()
    // Route 7 legs 90/100/90/110 s on 13 runs (12 frequency runs and Saturday), 120 s first leg at
    // midday, 80 s legs on Sunday night; the express 17 serves no consecutive pair.
    expect(c.runTimes.map((r: { medianS: number }) => r.medianS)).toEqual([90, 100, 90, 110])
    expect(c.runTimes[0].trips).toBe(16)
    expect(c.serviceDays).toEqual({ weekday: 10, saturday: 2, sunday: 2 })
    expect(c.tripsPerDay).toEqual({ weekday: 16, saturday: 1, sunday: 1 })
    const period = (name: string) => c.periods.find((p: { name: string }) => p.name === name).id
    const tph = (name: string, dayType: string) => c.tripsByPeriod.find((x: { periodId: string; dayType: string }) => x.periodId === period(name) && x.dayType === dayType)
    expect(tph('AM peak', 'weekday')).toMatchObject({ tripsPerDay: 14, tripsPerHour: 7 })
    expect(tph('Midday', 'weekday').tripsPerHour).toBeCloseTo(2 / 6, 6)
    expect(tph('Midday', 'saturday').tripsPerHour).toBeCloseTo(1 / 6, 6)
    expect(tph('Night', 'sunday').tripsPerHour).toBeCloseTo(1 / 7, 6)
    expect(tph('AM peak', 'sunday').tripsPerDay).toBe(0)
    expect(c.hourlyTrips.weekday.slice(7, 9)).toEqual([7, 7])
    expect(c.hourlyTrips.sunday[1]).toBe(1)
  })

  it('takes a shape by id and refuses one the trips do not follow', async () => {
    expect((await corridor({ routeIds: ['17'], shapeId: 'SH17E' })).stops.map((s: { stopId: string }) => s.stopId)).toEqual(['S1', 'S3', 'S5'])
    const res = await (await t.as('planner')).post('/api/corridors').send({ ...body(), shapeId: 'SH7W' }).expect(422)
    expect(paths(res)).toEqual(['shapeId'])
  })

  it('rejects invalid input with its paths', async () => {
    const agent = await t.as('planner')
    expect(paths(await agent.post('/api/corridors').send({ ...body(), routeIds: [], directionId: 2, extra: 1 }).expect(422))).toEqual(expect.arrayContaining(['routeIds', 'directionId', '']))
    expect(paths(await agent.post('/api/corridors').send({ ...body(), routeIds: ['7', 'nope'] }).expect(422))).toEqual(['routeIds.1'])
    expect(paths(await agent.post('/api/corridors').send({ ...body(), feedId: 9999 }).expect(422))).toEqual(['feedId'])
    expect(paths(await agent.post('/api/corridors').send({ ...body(), routeIds: ['17'], directionId: 1 }).expect(422))).toEqual(['directionId'])
  })

  it('is for planners and admins only', async () => {
    await request(t.app).post('/api/corridors').send(body()).expect(401)
    await (await t.as('engineer')).post('/api/corridors').send(body()).expect(403)
    await (await t.as('manager')).post('/api/corridors').send(body()).expect(403)
    await (await t.as('admin')).post('/api/corridors').send(body()).expect(201)
  })
})

describe('GET, PATCH and DELETE /api/corridors/:id', () => {
  it('lists corridors for every role and shows one', async () => {
    const c = await corridor({ name: 'Listed corridor' })
    for (const who of ['engineer', 'engineer2', 'manager'] as const) {
      const list = (await (await t.as(who)).get('/api/corridors').expect(200)).body
      expect(list.find((x: { id: string }) => x.id === c.id)).toMatchObject({ name: 'Listed corridor', stopCount: 5, approachCount: 0 })
      await (await t.as(who)).get(`/api/corridors/${c.id}`).expect(200)
    }
    await (await t.as('planner')).get('/api/corridors/nope').expect(404)
  })

  it('edits the name and the periods, keeping the ids of periods that stay', async () => {
    const c = await corridor()
    const agent = await t.as('planner')
    const [early, am, ...rest] = c.periods
    const periods = [{ ...am, startTime: '06:30' }, ...rest.slice(0, 3), { name: 'Late night', startTime: '22:00', endTime: '06:30' }]
    const res = await agent.patch(`/api/corridors/${c.id}`).send({ version: 1, name: 'Renamed', periods }).expect(200)
    expect(res.body).toMatchObject({ name: 'Renamed', version: 2 })
    expect(res.body.periods.map((p: { name: string }) => p.name)).toEqual(['AM peak', 'Midday', 'PM peak', 'Evening', 'Late night'])
    expect(res.body.periods[0]).toMatchObject({ id: am.id, startTime: '06:30' })
    expect(res.body.periods.some((p: { id: string }) => p.id === early.id)).toBe(false)
    // 2.5 h of AM peak now (06:30-09:00): 14 trips -> 5.6 per hour.
    const amTrips = res.body.tripsByPeriod.find((x: { periodId: string; dayType: string }) => x.periodId === am.id && x.dayType === 'weekday')
    expect(amTrips.tripsPerHour).toBeCloseTo(5.6, 6)
  })

  it('refuses overlapping periods, foreign ids, a stale version, other roles', async () => {
    const c = await corridor()
    const agent = await t.as('planner')
    const overlap = await agent.patch(`/api/corridors/${c.id}`).send({ version: 1, periods: [{ name: 'A', startTime: '07:00', endTime: '09:00' }, { name: 'B', startTime: '08:00', endTime: '10:00' }] }).expect(422)
    expect(paths(overlap)).toEqual(['periods.1.startTime'])
    expect(paths(await agent.patch(`/api/corridors/${c.id}`).send({ version: 1, periods: [{ id: 'nope', name: 'A', startTime: '07:00', endTime: '09:00' }] }).expect(422))).toEqual(['periods.0.id'])
    await agent.patch(`/api/corridors/${c.id}`).send({ version: 1, name: 'First' }).expect(200)
    const stale = await agent.patch(`/api/corridors/${c.id}`).send({ version: 1, name: 'Second' }).expect(409)
    expect(stale.body.current).toMatchObject({ name: 'First', version: 2 })
    await (await t.as('engineer')).patch(`/api/corridors/${c.id}`).send({ version: 2, name: 'Mine' }).expect(403)
    await (await t.as('engineer')).delete(`/api/corridors/${c.id}`).expect(403)
    await agent.delete(`/api/corridors/${c.id}?version=1`).expect(409)
    await agent.delete(`/api/corridors/${c.id}?version=2`).expect(204)
    await agent.get(`/api/corridors/${c.id}`).expect(404)
  })
})

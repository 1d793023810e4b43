import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import request from 'supertest'
import { eq } from 'drizzle-orm'
import { startTestApp, DEMO_PASSWORD, type TestApp } from '../support/test-app'
import { importCorridorFeed, metresAlong, SHAPE_7E_START_LON } from '../support/corridor-feed'
import { corridorApproaches, organisations, users } from '../../server/db/schema'
import { hashPassword } from '../../server/auth/password'

let t: TestApp
let feedId: number
let signals: Record<'first' | 'second' | 'far', { id: string }>
beforeAll(async () => {
  t = await startTestApp()
  feedId = await importCorridorFeed(t)
  const plan = { name: 'All day', dayTypes: ['weekday', 'saturday', 'sunday'], startTime: '00:00', endTime: '24:00', cycleS: 90, busGreenS: 46, yellowS: 4, redClearanceS: 2, crossMinGreenS: 8, pedWalkS: 7, pedClearanceS: 14, offsetS: 0 }
  const make = async (who: 'engineer' | 'engineer2', name: string, lat: number, lon: number, jurisdictionId: string) =>
    (await (await t.as(who)).post('/api/intersections').send({ name, lat, lon, jurisdictionId, crossingDistanceM: 14, plans: [plan] }).expect(201)).body
  signals = {
    first: await make('engineer', 'Main St & First Ave', 51.0, -1.8955, 'org-brackenford'),
    second: await make('engineer2', 'Main St & Second Ave', 51.0, -1.8875, 'org-osterfield'),
    far: await make('engineer', 'Hill Rd & Top Ln', 51.01, -1.89, 'org-brackenford'),
  }
})
afterAll(async () => { await t.close() })

const paths = (res: request.Response) => (res.body.issues as { path: (string | number)[] }[]).map((i) => i.path.join('.'))
const along = (lon: number) => metresAlong(lon - SHAPE_7E_START_LON)

async function corridor() {
  return (await (await t.as('planner')).post('/api/corridors').send({ feedId, name: 'Main St eastbound', routeIds: ['7'], directionId: 0 }).expect(201)).body
}
const base = (c: { periods: { id: string }[] }) => ({
  intersectionId: signals.first.id, lanes: 2, speedLimitKmh: 50, crossLanes: 1, stopRelation: 'far-side', stopId: 'S2', dwellS: 20,
  volumes: [{ periodId: c.periods[1].id, volumeVehPerHour: 900, crossVolumeVehPerHour: 400 }],
})

describe('POST /api/corridors/:id/approaches', () => {
  it('snaps the intersection to the shape and fills the defaults', async () => {
    const c = await corridor()
    const res = await (await t.as('planner')).post(`/api/corridors/${c.id}/approaches`).send(base(c)).expect(201)
    expect(res.body).toMatchObject({
      intersectionName: 'Main St & First Ave', jurisdictionId: 'org-brackenford', lanes: 2, stopRelation: 'far-side', stopId: 'S2', stopName: 'Stop 2',
      // Defaults: 1800 veh/h/lane (HCM base 1900 pc/h/ln adjusted, common practice), 133 veh/km/lane (7.5 m per vehicle, common practice).
      saturationFlowVehPerHourPerLane: 1800, jamDensityVehPerKmPerLane: 133, crossSaturationFlowVehPerHourPerLane: 1800, checkInDistanceM: 150, version: 1,
    })
    // On the shape's parallel: 0.0055 deg of longitude east of the shape start at 51.0 deg.
    expect(res.body.distanceM).toBeCloseTo(along(-1.8955), 0)
    expect(res.body.snapOffsetM).toBeCloseTo(0, 1)
    expect(res.body.volumes).toEqual([{ periodId: c.periods[1].id, volumeVehPerHour: 900, crossVolumeVehPerHour: 400 }])
  })

  it('snaps a given point, or takes a distance, and lists approaches in order along the corridor', async () => {
    const c = await corridor()
    const agent = await t.as('planner')
    const second = await agent.post(`/api/corridors/${c.id}/approaches`)
      .send({ ...base(c), intersectionId: signals.second.id, snap: { lat: 51.0003, lon: -1.8875 }, stopRelation: 'near-side', stopId: 'S3' }).expect(201)
    expect(second.body.distanceM).toBeCloseTo(along(-1.8875), 0)
    expect(second.body.snapOffsetM).toBeCloseTo(33.4, 0) // 0.0003 deg of latitude
    await agent.post(`/api/corridors/${c.id}/approaches`).send({ ...base(c), distanceM: 400 }).expect(201)
    const detail = (await (await t.as('engineer2')).get(`/api/corridors/${c.id}`).expect(200)).body
    expect(detail.approaches.map((a: { intersectionName: string; distanceM: number }) => [a.intersectionName, Math.round(a.distanceM)]))
      .toEqual([['Main St & First Ave', 400], ['Main St & Second Ave', Math.round(along(-1.8875))]])
    expect(detail.approachCount).toBe(2)
    expect((await agent.get(`/api/corridors/${c.id}/approaches`).expect(200)).body).toHaveLength(2)
  })

  it('rejects invalid input with the path of each problem', async () => {
    const c = await corridor()
    const agent = await t.as('planner')
    const url = `/api/corridors/${c.id}/approaches`
    expect(paths(await agent.post(url).send({ ...base(c), lanes: 0, stopRelation: 'middle', extra: true }).expect(422))).toEqual(expect.arrayContaining(['lanes', 'stopRelation', '']))
    // S1 is 315 m before the stop line: too far for a near-side stop (at most 200 m, common practice).
    expect(paths(await agent.post(url).send({ ...base(c), stopRelation: 'near-side', stopId: 'S1' }).expect(422))).toEqual(['stopRelation'])
    expect(paths(await agent.post(url).send({ ...base(c), stopId: 'W1', dwellS: null }).expect(422))).toEqual(['stopId', 'dwellS'])
    expect(paths(await agent.post(url).send({ ...base(c), stopRelation: 'none' }).expect(422))).toEqual(['stopId'])
    expect(paths(await agent.post(url).send({ ...base(c), volumes: [{ periodId: 'nope', volumeVehPerHour: 1, crossVolumeVehPerHour: 1 }] }).expect(422))).toEqual(['volumes.0.periodId'])
    expect(paths(await agent.post(url).send({ ...base(c), distanceM: 5000 }).expect(422))).toEqual(['distanceM', 'stopRelation'])
    expect(paths(await agent.post(url).send({ ...base(c), distanceM: 400, snap: { lat: 51, lon: -1.9 } }).expect(422))).toEqual(['snap'])
    const far = await agent.post(url).send({ ...base(c), intersectionId: signals.far.id }).expect(422)
    expect(paths(far)).toEqual(['intersectionId'])
    expect(far.body.issues[0].message).toMatch(/m from the corridor/)
    expect(paths(await agent.post(url).send({ ...base(c), intersectionId: 'nope' }).expect(422))).toEqual(['intersectionId'])
    await agent.post(url).send(base(c)).expect(201)
    expect(paths(await agent.post(url).send(base(c)).expect(422))).toEqual(['intersectionId'])
  })

  it('is 403 for engineers, managers and a planner of another agency; 404 for an unknown corridor', async () => {
    const c = await corridor()
    const url = `/api/corridors/${c.id}/approaches`
    await (await t.as('engineer')).post(url).send(base(c)).expect(403)
    await (await t.as('manager')).post(url).send(base(c)).expect(403)
    await t.database.db.insert(organisations).values({ id: 'org-other-agency', name: 'Other Transit', kind: 'agency' }).onConflictDoNothing()
    await t.database.db.insert(users).values({ id: 'user-other', email: 'other@fanlight.test', name: 'Other Planner', role: 'planner', organisationId: 'org-other-agency', passwordHash: await hashPassword(DEMO_PASSWORD) }).onConflictDoNothing()
    const other = request.agent(t.app)
    await other.post('/api/auth/login').send({ email: 'other@fanlight.test', password: DEMO_PASSWORD }).expect(200)
    await other.post(url).send(base(c)).expect(403)
    await other.patch(`/api/corridors/${c.id}`).send({ version: 1, name: 'Taken over' }).expect(403)
    await (await t.as('admin')).post(url).send(base(c)).expect(201)
    await (await t.as('planner')).post('/api/corridors/nope/approaches').send(base(c)).expect(404)
  })
})

describe('PATCH and DELETE /api/corridors/:id/approaches/:aid', () => {
  it('changes data with versions: 409 with the current row when stale', async () => {
    const c = await corridor()
    const agent = await t.as('planner')
    const a = (await agent.post(`/api/corridors/${c.id}/approaches`).send(base(c)).expect(201)).body
    const url = `/api/corridors/${c.id}/approaches/${a.id}`
    const moved = (await agent.patch(url).send({ version: 1, distanceM: 420, lanes: 3, volumes: [] }).expect(200)).body
    expect(moved).toMatchObject({ distanceM: 420, snapOffsetM: null, lanes: 3, volumes: [], version: 2 })
    const stale = await agent.patch(url).send({ version: 1, lanes: 1 }).expect(409)
    expect(stale.body.current).toMatchObject({ lanes: 3, version: 2 })
    const snapped = (await agent.patch(url).send({ version: 2, snapIntersection: true, stopRelation: 'none' }).expect(200)).body
    expect(snapped.distanceM).toBeCloseTo(along(-1.8955), 0)
    expect(snapped).toMatchObject({ stopRelation: 'none', stopId: null, dwellS: null, version: 3 })
    await (await t.as('engineer')).patch(url).send({ version: 3, lanes: 1 }).expect(403)
    await agent.patch(`/api/corridors/${c.id}/approaches/nope`).send({ version: 1, lanes: 1 }).expect(404)
    expect(paths(await agent.patch(url).send({ version: 3, lanes: 1.5 }).expect(422))).toEqual(['lanes'])
  })

  it('deletes an approach; an intersection in use cannot be deleted', async () => {
    const c = await corridor()
    const agent = await t.as('planner')
    const a = (await agent.post(`/api/corridors/${c.id}/approaches`).send(base(c)).expect(201)).body
    const refused = await (await t.as('engineer')).delete(`/api/intersections/${signals.first.id}`).expect(409)
    expect(refused.body.message).toContain('Main St eastbound')
    await agent.delete(`/api/corridors/${c.id}/approaches/${a.id}?version=9`).expect(409)
    await agent.delete(`/api/corridors/${c.id}/approaches/${a.id}`).expect(204)
    await agent.get(`/api/corridors/${c.id}/approaches/${a.id}`).expect(404)
  })
})

describe('CSV import of approaches', () => {
  const header = 'intersection_name,jurisdiction,distance_m,lanes,speed_limit_kmh,cross_lanes,stop_relation,stop_id,dwell_s,period,volume_veh_h,cross_volume_veh_h'
  const good = [
    header,
    'Main St & First Ave,org-brackenford,,2,50,1,far-side,S2,20,AM peak,900,400',
    'Main St & First Ave,org-brackenford,,2,50,1,far-side,S2,20,Midday,700,300',
    'Main St & Second Ave,City of Osterfield,,2,50,2,near-side,S3,25,AM peak,850,600',
  ].join('\n')

  it('serves a template and imports a file, then updates from a second import', async () => {
    const c = await corridor()
    const agent = await t.as('planner')
    const template = await agent.get('/api/corridors/approaches/import/template').expect(200)
    expect(template.headers['content-type']).toMatch(/text\/csv/)
    expect(template.text.split('\n')[0]).toContain('intersection_name,jurisdiction,distance_m,lanes')
    const res = await agent.post(`/api/corridors/${c.id}/approaches/import`).attach('file', Buffer.from(good), 'approaches.csv').expect(200)
    expect(res.body).toEqual({ created: 2, updated: 0 })
    const list = (await agent.get(`/api/corridors/${c.id}/approaches`).expect(200)).body
    expect(list.map((a: { intersectionName: string; volumes: unknown[] }) => [a.intersectionName, a.volumes.length])).toEqual([['Main St & First Ave', 2], ['Main St & Second Ave', 1]])
    expect(list[0].distanceM).toBeCloseTo(along(-1.8955), 0)
    const again = await agent.post(`/api/corridors/${c.id}/approaches/import`).attach('file', Buffer.from(good.replace(',900,400', ',950,400')), 'approaches.csv').expect(200)
    expect(again.body).toEqual({ created: 0, updated: 2 })
    const after = (await agent.get(`/api/corridors/${c.id}/approaches`).expect(200)).body
    expect(after[0].id).toBe(list[0].id)
    expect(after[0]).toMatchObject({ version: 2 })
    expect(after[0].volumes.find((v: { periodId: string }) => v.periodId === c.periods[1].id).volumeVehPerHour).toBe(950)
  })

  it('stores nothing when a line is bad and reports each line and column', async () => {
    const c = await corridor()
    const agent = await t.as('planner')
    const bad = good + '\nMain St & First Ave,org-brackenford,,3,50,1,far-side,S2,20,PM peak,800,350' +
      '\nNowhere St & Void Ave,,,2,50,1,none,,,AM peak,100,100\nMain St & Second Ave,City of Osterfield,,2,50,2,near-side,S3,25,Teatime,1,1'
    const res = await agent.post(`/api/corridors/${c.id}/approaches/import`).attach('file', Buffer.from(bad), 'approaches.csv').expect(422)
    expect(res.body.lines.map((l: { line: number; column: string; value: string }) => [l.line, l.column, l.value])).toEqual([
      [5, 'lanes', '3'], [6, 'intersection_name', 'Nowhere St & Void Ave'], [7, 'period', 'Teatime'],
    ])
    expect(await t.database.db.select().from(corridorApproaches).where(eq(corridorApproaches.corridorId, c.id))).toEqual([])
    const tooFar = `${header}\nHill Rd & Top Ln,,,2,50,1,none,,,AM peak,100,100\nMain St & First Ave,,,2,50,1,near-side,S1,20,,,`
    const far = await agent.post(`/api/corridors/${c.id}/approaches/import`).attach('file', Buffer.from(tooFar), 'approaches.csv').expect(422)
    expect(far.body.lines.map((l: { line: number; column: string }) => [l.line, l.column])).toEqual([[2, 'distance_m'], [3, 'stop_relation']])
    await (await t.as('engineer')).post(`/api/corridors/${c.id}/approaches/import`).attach('file', Buffer.from(good), 'a.csv').expect(403)
  })
})

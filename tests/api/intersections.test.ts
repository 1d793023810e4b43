import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import request from 'supertest'
import { startTestApp, type TestApp } from '../support/test-app'

let t: TestApp
// One app and database for the file (the demo seed is in it too); every test names its own signals.
beforeAll(async () => { t = await startTestApp() })
afterAll(async () => { await t.close() })
let n = 0
const unique = (name: string) => `${name} ${++n}`

// 100 s cycle, 52 s bus green, intergreens of 4 + 2 s: 36 s cross green. A 16 m crosswalk needs
// 16 / 1.0668 = 15.0 s of clearance [P: MUTCD 2009 sec. 4E.06].
const plan = {
  name: 'AM peak', dayTypes: ['weekday'], startTime: '07:00', endTime: '09:00', cycleS: 100, busGreenS: 52, yellowS: 4,
  redClearanceS: 2, crossMinGreenS: 10, pedWalkS: 7, pedClearanceS: 15, offsetS: 12,
}
const signal = { name: 'Kestrel Ave & Test St', lat: 51.5, lon: -1.2, jurisdictionId: 'org-brackenford', crossingDistanceM: 16, plans: [plan] }
const paths = (res: request.Response) => (res.body.issues as { path: (string | number)[] }[]).map((i) => i.path.join('.'))

async function created(name = unique('Kestrel Ave & Test St')) {
  const agent = await t.as('engineer')
  return (await agent.post('/api/intersections').send({ ...signal, name }).expect(201)).body
}
const names = async (query = '') => ((await (await t.as('planner')).get(`/api/intersections${query}`).expect(200)).body as { name: string }[]).map((i) => i.name)

describe('POST /api/intersections', () => {
  it('lets an engineer of the city create a signal with its plans, and everyone read it', async () => {
    const body = await created()
    expect(body).toMatchObject({ name: expect.stringContaining(signal.name), jurisdictionId: 'org-brackenford', jurisdictionName: 'City of Brackenford', version: 1, minPedWalkS: 7 })
    expect(body.plans).toMatchObject([{ ...plan, pedConcurrent: true, version: 1 }])
    for (const who of ['planner', 'manager', 'engineer2'] as const) {
      const agent = await t.as(who)
      expect((await agent.get(`/api/intersections/${body.id}`).expect(200)).body.plans).toHaveLength(1)
      expect((await agent.get('/api/intersections').expect(200)).body.map((i: { id: string }) => i.id)).toContain(body.id)
    }
    expect(await names('?jurisdictionId=org-osterfield')).not.toContain(body.name)
    expect(await names('?jurisdictionId=org-brackenford')).toContain(body.name)
    expect(await names(`?q=${encodeURIComponent('test st')}`)).toContain(body.name)
  })

  it('is 401 signed out, 403 for planners and managers, and 403 for another city\'s engineer', async () => {
    await request(t.app).get('/api/intersections').expect(401)
    await (await t.as('planner')).post('/api/intersections').send(signal).expect(403)
    await (await t.as('manager')).post('/api/intersections').send(signal).expect(403)
    const res = await (await t.as('engineer2')).post('/api/intersections').send(signal).expect(403)
    expect(res.body.error).toBe('forbidden')
    await (await t.as('admin')).post('/api/intersections').send(signal).expect(201)
  })

  it('rejects invalid fields with their paths', async () => {
    const res = await (await t.as('engineer')).post('/api/intersections')
      .send({ ...signal, lat: 95, crossingDistanceM: -1, minPedWalkS: 3, plans: [{ ...plan, dayTypes: ['holiday'], startTime: '7am' }], extra: 1 })
      .expect(422)
    expect(paths(res)).toEqual(expect.arrayContaining(['lat', 'crossingDistanceM', 'minPedWalkS', 'plans.0.dayTypes.0', 'plans.0.startTime', '']))
  })

  // Yellow 3-6 s [P: MUTCD 2009 sec. 4D.26]; clearance 20 m / 1.0668 m/s = 18.75 s [P: MUTCD 2009 sec. 4E.06].
  it('refuses timing that breaks a safety rule, naming the plan field', async () => {
    const name = unique('Kestrel Ave & Refused St')
    const res = await (await t.as('engineer')).post('/api/intersections')
      .send({ ...signal, name, crossingDistanceM: 20, plans: [plan, { ...plan, name: 'Midday', startTime: '09:00', endTime: '15:00', yellowS: 2.5 }] })
      .expect(422)
    expect(paths(res)).toEqual(['plans.0.pedClearanceS', 'plans.1.yellowS', 'plans.1.pedClearanceS'])
    expect(res.body.issues[0].message).toContain('18.8 s')
    expect(await names()).not.toContain(name)
  })

  it('refuses a city that does not exist, the agency as a jurisdiction, and a duplicate name', async () => {
    const agent = await t.as('admin')
    expect(paths(await agent.post('/api/intersections').send({ ...signal, jurisdictionId: 'org-lindenmere' }).expect(422))).toEqual(['jurisdictionId'])
    expect(paths(await agent.post('/api/intersections').send({ ...signal, jurisdictionId: 'org-nowhere' }).expect(422))).toEqual(['jurisdictionId'])
    const first = await created()
    expect(paths(await agent.post('/api/intersections').send({ ...signal, name: first.name.toUpperCase() }).expect(422))).toEqual(['name'])
  })
})

describe('PATCH and DELETE /api/intersections/:id', () => {
  it('updates with the current version and answers 409 with the current row when stale', async () => {
    const s = await created()
    const agent = await t.as('engineer')
    const moved = await agent.patch(`/api/intersections/${s.id}`).send({ version: 1, lat: 51.501 }).expect(200)
    expect(moved.body).toMatchObject({ lat: 51.501, version: 2 })
    const stale = await agent.patch(`/api/intersections/${s.id}`).send({ version: 1, lat: 51.7 }).expect(409)
    expect(stale.body.current).toMatchObject({ id: s.id, lat: 51.501, version: 2 })
  })

  it('is 403 for another city\'s engineer and 404 for an unknown id', async () => {
    const s = await created()
    await (await t.as('engineer2')).patch(`/api/intersections/${s.id}`).send({ version: 1, lat: 51.7 }).expect(403)
    await (await t.as('engineer2')).delete(`/api/intersections/${s.id}`).expect(403)
    await (await t.as('planner')).patch(`/api/intersections/${s.id}`).send({ version: 1, lat: 51.7 }).expect(403)
    await (await t.as('engineer')).patch('/api/intersections/nope').send({ version: 1, lat: 51.7 }).expect(404)
    await (await t.as('planner')).get('/api/intersections/nope').expect(404)
    // An engineer cannot hand a signal to another city; an admin can.
    await (await t.as('engineer')).patch(`/api/intersections/${s.id}`).send({ version: 1, jurisdictionId: 'org-osterfield' }).expect(403)
    await (await t.as('admin')).patch(`/api/intersections/${s.id}`).send({ version: 1, jurisdictionId: 'org-osterfield' }).expect(200)
  })

  it('refuses a wider crosswalk that the stored plans cannot clear', async () => {
    const s = await created()
    // 20 m needs 18.75 s of clearance; the plan gives 15 s [P: MUTCD 2009 sec. 4E.06].
    const res = await (await t.as('engineer')).patch(`/api/intersections/${s.id}`).send({ version: 1, crossingDistanceM: 20 }).expect(422)
    expect(paths(res)).toEqual(['crossingDistanceM'])
    expect(res.body.issues[0].message).toContain('AM peak')
  })

  it('deletes with its plans; a stale version is 409', async () => {
    const s = await created()
    const agent = await t.as('engineer')
    await agent.delete(`/api/intersections/${s.id}?version=7`).expect(409)
    await agent.delete(`/api/intersections/${s.id}?version=1`).expect(204)
    await agent.get(`/api/intersections/${s.id}`).expect(404)
  })

  it('refuses to delete a signal that a corridor or a proposal still refers to (409, not a 500)', async () => {
    const engineer = await t.as('engineer')
    const planner = await t.as('planner')
    const list = await engineer.get('/api/intersections').expect(200)
    const items = (Array.isArray(list.body) ? list.body : list.body.items) as { id: string; name: string; version: number }[]
    const tanner = items.find((i) => i.name.includes('Tanner Street'))!
    const inUse = await engineer.delete(`/api/intersections/${tanner.id}?version=${tanner.version}`).expect(409)
    expect(inUse.body.message).toContain('Kestrel Avenue eastbound')
    // Remove the corridor's approach: the demo proposal's row still records the intersection.
    const corridors = await planner.get('/api/corridors').expect(200)
    const corridor = await planner.get(`/api/corridors/${corridors.body[0].id}`).expect(200)
    const approach = corridor.body.approaches.find((a: { intersectionId: string }) => a.intersectionId === tanner.id)
    await planner.delete(`/api/corridors/${corridor.body.id}/approaches/${approach.id}?version=${approach.version}`).expect(204)
    const still = await engineer.delete(`/api/intersections/${tanner.id}?version=${tanner.version}`).expect(409)
    expect(still.body.message).toContain('proposal')
    await engineer.get(`/api/intersections/${tanner.id}`).expect(200)
  })
})

describe('timing plans', () => {
  const midday = { ...plan, name: 'Midday', startTime: '09:00', endTime: '15:00', cycleS: 90, busGreenS: 46 }

  it('adds, changes and deletes a plan with versions', async () => {
    const s = await created()
    const agent = await t.as('engineer')
    const p = (await agent.post(`/api/intersections/${s.id}/plans`).send(midday).expect(201)).body
    expect(p).toMatchObject({ name: 'Midday', version: 1, intersectionId: s.id })
    const list = (await (await t.as('planner')).get(`/api/intersections/${s.id}/plans`).expect(200)).body
    expect(list.map((x: { name: string }) => x.name)).toEqual(['AM peak', 'Midday'])
    const changed = (await agent.patch(`/api/intersections/${s.id}/plans/${p.id}`).send({ version: 1, busGreenS: 44 }).expect(200)).body
    expect(changed).toMatchObject({ busGreenS: 44, cycleS: 90, version: 2 })
    const stale = await agent.patch(`/api/intersections/${s.id}/plans/${p.id}`).send({ version: 1, busGreenS: 40 }).expect(409)
    expect(stale.body.current).toMatchObject({ busGreenS: 44, version: 2 })
    await agent.delete(`/api/intersections/${s.id}/plans/${p.id}?version=2`).expect(204)
    await agent.delete(`/api/intersections/${s.id}/plans/${p.id}`).expect(404)
  })

  it('refuses a plan that overlaps another or leaves too little cross-street green', async () => {
    const s = await created()
    const agent = await t.as('engineer')
    const overlap = await agent.post(`/api/intersections/${s.id}/plans`).send({ ...midday, startTime: '08:30' }).expect(422)
    expect(paths(overlap)).toEqual(['startTime'])
    expect(overlap.body.issues[0].message).toContain('AM peak')
    // 90 - 70 - 12 = 8 s of cross green, under the 10 s minimum [M: Signal Timing Manual, from memory].
    const squeezed = await agent.patch(`/api/intersections/${s.id}/plans/${s.plans[0].id}`).send({ version: 1, busGreenS: 78 }).expect(422)
    expect(paths(squeezed)).toEqual(['busGreenS'])
    await agent.patch(`/api/intersections/${s.id}/plans/${s.plans[0].id}`).send({ version: 1, yellowS: 7 }).expect(422)
  })

  it('is 403 for another city\'s engineer and for a planner; 404 for an unknown plan', async () => {
    const s = await created()
    await (await t.as('engineer2')).post(`/api/intersections/${s.id}/plans`).send(midday).expect(403)
    await (await t.as('engineer2')).patch(`/api/intersections/${s.id}/plans/${s.plans[0].id}`).send({ version: 1, busGreenS: 50 }).expect(403)
    await (await t.as('planner')).post(`/api/intersections/${s.id}/plans`).send(midday).expect(403)
    await (await t.as('engineer')).patch(`/api/intersections/${s.id}/plans/nope`).send({ version: 1, busGreenS: 50 }).expect(404)
    await (await t.as('engineer')).post('/api/intersections/nope/plans').send(midday).expect(404)
  })
})

describe('CSV import of intersections and timing', () => {
  const header = 'intersection_name,lat,lon,jurisdiction,crossing_distance_m,plan_name,day_types,start_time,end_time,cycle_s,bus_green_s,yellow_s,red_clearance_s,cross_min_green_s,ped_walk_s,ped_clearance_s,offset_s'
  // Streets named per test: the file's intersections are created by the first import of a name.
  const file = (tag: string) => [
    header,
    `Kestrel Ave & Mill Rd ${tag},51.5,-1.2,org-brackenford,16,AM peak,weekday,07:00,09:00,100,52,4,2,10,7,15,0`,
    `Kestrel Ave & Mill Rd ${tag},51.5,-1.2,org-brackenford,16,Midday,weekday,09:00,15:00,90,46,4,2,10,7,15,5`,
    `Kestrel Ave & Ash St ${tag},51.51,-1.19,City of Brackenford,14,All day,weekday;saturday;sunday,00:00,24:00,90,50,4,1.5,8,7,14,30`,
  ].join('\n')

  it('serves a template with every column that imports as it is', async () => {
    const agent = await t.as('engineer')
    const res = await agent.get('/api/intersections/import/template').expect(200)
    expect(res.headers['content-type']).toMatch(/text\/csv/)
    expect(res.headers['content-disposition']).toMatch(/attachment/)
    expect(res.text.split('\n')[0]).toContain(header.split(',').slice(0, 5).join(','))
    const imported = await agent.post('/api/intersections/import').attach('file', Buffer.from(res.text), 'template.csv').expect(200)
    expect(imported.body).toMatchObject({ intersectionsCreated: 1, plansCreated: 2 })
  })

  it('imports a file and re-imports it as updates, keeping plan ids', async () => {
    const good = file('A')
    const agent = await t.as('engineer')
    const first = await agent.post('/api/intersections/import').attach('file', Buffer.from(good), 'signals.csv').expect(200)
    expect(first.body).toEqual({ intersectionsCreated: 2, intersectionsUpdated: 0, plansCreated: 3, plansUpdated: 0 })
    const before = (await agent.get('/api/intersections').expect(200)).body
    const again = await agent.post('/api/intersections/import').attach('file', Buffer.from(good.replace(',100,52,', ',100,50,')), 'signals.csv').expect(200)
    expect(again.body).toEqual({ intersectionsCreated: 0, intersectionsUpdated: 2, plansCreated: 0, plansUpdated: 3 })
    const after = (await agent.get('/api/intersections').expect(200)).body
    const mill = (list: { name: string; plans: { id: string; name: string; busGreenS: number; version: number }[] }[]) =>
      list.find((i) => i.name === 'Kestrel Ave & Mill Rd A')!.plans.find((p) => p.name === 'AM peak')!
    expect(mill(after).id).toBe(mill(before).id)
    expect(mill(after)).toMatchObject({ busGreenS: 50, version: 2 })
  })

  it('stores nothing when one line is bad and reports line, column, value and reason', async () => {
    const bad = file('B') + '\nKestrel Ave & Elm St B,51.52,-1.18,org-brackenford,20,AM peak,weekday,07:00,09:00,100,52,2.5,2,10,7,15,0' +
      '\nKestrel Ave & Mill Rd B,51.5,-1.2,org-brackenford,16,PM peak,weekday,14:00,18:00,100,52,4,2,10,7,15,0'
    const agent = await t.as('engineer')
    const res = await agent.post('/api/intersections/import').attach('file', Buffer.from(bad), 'signals.csv').expect(422)
    expect(res.body.error).toBe('csv_invalid')
    // Line 5: yellow 2.5 s below 3 s [MUTCD 2009 sec. 4D.26]; 20 m needs 18.75 s clearance [MUTCD 2009 sec. 4E.06].
    // Line 6: the PM plan overlaps Midday (09:00-15:00).
    expect(res.body.lines.map((l: { line: number; column: string; value: string }) => [l.line, l.column, l.value])).toEqual([
      [5, 'yellow_s', '2.5'], [5, 'ped_clearance_s', '15'], [6, 'start_time', '14:00-18:00'],
    ])
    expect(res.body.lines[2].message).toContain('Midday')
    expect((await names()).filter((x) => x.endsWith(' B'))).toEqual([])
  })

  it('refuses lines of another city for an engineer, and inconsistent repeated columns', async () => {
    const other = file('C').replace('Ash St C,51.51,-1.19,City of Brackenford', 'Ash St C,51.51,-1.19,org-osterfield')
      .replace('Mill Rd C,51.5,-1.2,org-brackenford,16,Midday', 'Mill Rd C,51.5,-1.2,org-brackenford,17,Midday')
    const res = await (await t.as('engineer')).post('/api/intersections/import').attach('file', Buffer.from(other), 'signals.csv').expect(422)
    expect(res.body.lines.map((l: { line: number; column: string }) => [l.line, l.column])).toEqual([[3, 'crossing_distance_m'], [4, 'jurisdiction']])
  })

  it('is 403 for planners, 400 without a file, 422 for an unknown column', async () => {
    const good = file('D')
    await (await t.as('planner')).post('/api/intersections/import').attach('file', Buffer.from(good), 'signals.csv').expect(403)
    await (await t.as('engineer')).post('/api/intersections/import').expect(400)
    const res = await (await t.as('engineer')).post('/api/intersections/import').attach('file', Buffer.from(good.replace('offset_s', 'offset')), 's.csv').expect(422)
    expect(res.body.lines[0]).toMatchObject({ line: 1, column: 'offset' })
  })
})

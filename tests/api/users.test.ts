import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest'
import request from 'supertest'
import { eq } from 'drizzle-orm'
import { startTestApp, DEMO_EMAIL, type TestApp } from '../support/test-app'
import { users } from '../../server/db/schema'

let t: TestApp
beforeAll(async () => { t = await startTestApp() })
afterAll(async () => { await t.close() })
beforeEach(async () => { await t.reset() })

const invite = { email: 'Ola@Fanlight.test', name: 'Ola Brightwater', role: 'engineer', organisationId: 'org-osterfield' }

describe('GET /api/users', () => {
  it('lists every user with the organisation for an admin', async () => {
    const admin = await t.as('admin')
    const res = await admin.get('/api/users').expect(200)
    expect(res.body).toHaveLength(5)
    expect(res.body.find((u: { email: string }) => u.email === DEMO_EMAIL.engineer).organisation.name).toBe('City of Brackenford')
  })

  it('is 401 signed out and 403 for every other role', async () => {
    await request(t.app).get('/api/users').expect(401)
    for (const account of ['planner', 'engineer', 'manager'] as const) {
      await (await t.as(account)).get('/api/users').expect(403)
    }
  })
})

describe('invitations', () => {
  it('creates the user, mails a link, and the link sets a password that signs in once', async () => {
    const admin = await t.as('admin')
    const res = await admin.post('/api/users').send(invite).expect(201)
    expect(res.body).toMatchObject({ email: 'ola@fanlight.test', role: 'engineer', active: true, organisation: { id: 'org-osterfield' } })

    const outbox = await admin.get('/api/outbox').expect(200)
    const mail = outbox.body.find((m: { to: string }) => m.to.includes('ola@fanlight.test'))
    expect(mail.subject).toBe('You are invited to Fanlight')
    const token = /\/invite\/([\w-]+)/.exec(mail.text)?.[1]
    expect(token).toBeTruthy()

    await request(t.app).post('/api/auth/login').send({ email: 'ola@fanlight.test', password: 'a-long-password' }).expect(401)
    await request(t.app).post('/api/auth/invite/accept').send({ token, password: 'short' }).expect(422)
    await request(t.app).post('/api/auth/invite/accept').send({ token, password: 'a-long-password' }).expect(200)
    await request(t.app).post('/api/auth/invite/accept').send({ token, password: 'another-long-one' }).expect(404)
    const login = await request(t.app).post('/api/auth/login').send({ email: 'ola@fanlight.test', password: 'a-long-password' }).expect(200)
    expect(login.body.user.role).toBe('engineer')
  })

  it('rejects a bad body with the field paths, and an engineer outside a city', async () => {
    const admin = await t.as('admin')
    const bad = await admin.post('/api/users').send({ email: 'x', role: 'boss', organisationId: '' }).expect(422)
    const paths = bad.body.issues.map((i: { path: string[] }) => i.path.join('.'))
    expect(paths).toEqual(expect.arrayContaining(['email', 'name', 'role', 'organisationId']))
    const wrongOrg = await admin.post('/api/users').send({ ...invite, organisationId: 'org-lindenmere' }).expect(422)
    expect(wrongOrg.body.issues[0].path).toEqual(['organisationId'])
    const count = await t.database.db.select().from(users)
    expect(count).toHaveLength(5)
  })

  it('refuses a second user with the same e-mail (409)', async () => {
    const admin = await t.as('admin')
    await admin.post('/api/users').send({ ...invite, email: DEMO_EMAIL.planner, role: 'planner', organisationId: 'org-lindenmere' }).expect(409)
  })

  it('is 403 for every role but admin', async () => {
    for (const account of ['planner', 'engineer', 'manager'] as const) {
      await (await t.as(account)).post('/api/users').send(invite).expect(403)
    }
  })
})

describe('PATCH /api/users/:id', () => {
  it('changes a role and deactivates a user, whose session then ends', async () => {
    const admin = await t.as('admin')
    const manager = await t.as('manager')
    await manager.get('/api/auth/me').expect(200)
    const res = await admin.patch('/api/users/user-manager').send({ role: 'planner' }).expect(200)
    expect(res.body.role).toBe('planner')
    await admin.patch('/api/users/user-manager').send({ active: false }).expect(200)
    await manager.get('/api/auth/me').expect(401)
    const [row] = await t.database.db.select().from(users).where(eq(users.id, 'user-manager'))
    expect(row.active).toBe(false)
  })

  it('refuses an engineer role at the agency, self-deactivation, unknown fields and unknown users', async () => {
    const admin = await t.as('admin')
    await admin.patch('/api/users/user-planner').send({ role: 'engineer' }).expect(409)
    await admin.patch('/api/users/user-admin').send({ active: false }).expect(409)
    const res = await admin.patch('/api/users/user-planner').send({ role: 'planner', colour: 'red' }).expect(422)
    expect(JSON.stringify(res.body.issues)).toContain('colour')
    await admin.patch('/api/users/nobody').send({ active: false }).expect(404)
  })

  it('is 403 for a planner', async () => {
    await (await t.as('planner')).patch('/api/users/user-manager').send({ active: false }).expect(403)
  })
})

describe('GET /api/outbox and /api/organisations', () => {
  it('outbox is admin only, newest first', async () => {
    const admin = await t.as('admin')
    await admin.post('/api/users').send(invite).expect(201)
    await admin.post('/api/users').send({ ...invite, email: 'second@fanlight.test' }).expect(201)
    const res = await admin.get('/api/outbox').expect(200)
    expect(res.body.map((m: { to: string }) => m.to)).toEqual([expect.stringContaining('second@'), expect.stringContaining('ola@')])
    expect(Object.keys(res.body[0]).sort()).toEqual(['createdAt', 'id', 'subject', 'text', 'to'])
    await (await t.as('planner')).get('/api/outbox').expect(403)
    await request(t.app).get('/api/outbox').expect(401)
  })

  it('organisations are readable by every signed-in role', async () => {
    const res = await (await t.as('engineer')).get('/api/organisations').expect(200)
    expect(res.body.map((o: { kind: string }) => o.kind).sort()).toEqual(['agency', 'city', 'city'])
    await request(t.app).get('/api/organisations').expect(401)
  })
})

describe('PATCH /api/organisations/:id', () => {
  it('lets an admin switch an organisation to US customary units, seen in its people\'s /me', async () => {
    const admin = await t.as('admin')
    const res = await admin.patch('/api/organisations/org-osterfield').send({ unitSystem: 'us' }).expect(200)
    expect(res.body).toMatchObject({ id: 'org-osterfield', unitSystem: 'us' })
    const me = await (await t.as('engineer2')).get('/api/auth/me').expect(200)
    expect(me.body.user.organisation.unitSystem).toBe('us')
  })

  it('is 422 for an unknown unit system, 404 for an unknown organisation, 403 for other roles', async () => {
    const admin = await t.as('admin')
    const bad = await admin.patch('/api/organisations/org-osterfield').send({ unitSystem: 'imperial' }).expect(422)
    expect(bad.body.issues[0].path).toEqual(['unitSystem'])
    await admin.patch('/api/organisations/nowhere').send({ unitSystem: 'us' }).expect(404)
    await (await t.as('engineer2')).patch('/api/organisations/org-osterfield').send({ unitSystem: 'us' }).expect(403)
  })
})

describe('GET /api/jobs/:id', () => {
  it('is 404 for an unknown job and 401 signed out', async () => {
    await (await t.as('planner')).get('/api/jobs/unknown').expect(404)
    await request(t.app).get('/api/jobs/unknown').expect(401)
  })
})

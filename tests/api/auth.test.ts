import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import request from 'supertest'
import { eq } from 'drizzle-orm'
import { startTestApp, DEMO_EMAIL, DEMO_PASSWORD, type TestApp } from '../support/test-app'
import { sessions, users } from '../../server/db/schema'

let t: TestApp
beforeAll(async () => { t = await startTestApp() })
afterAll(async () => { await t.close() })

describe('health', () => {
  it('answers ok', async () => {
    const res = await request(t.app).get('/api/health').expect(200)
    expect(res.body).toEqual({ ok: true })
  })
})

describe('POST /api/auth/login', () => {
  it('signs in with the demo pair and sets an HttpOnly, SameSite=Lax cookie', async () => {
    const res = await request(t.app).post('/api/auth/login').send({ email: DEMO_EMAIL.planner, password: DEMO_PASSWORD }).expect(200)
    expect(res.body.user).toMatchObject({ email: DEMO_EMAIL.planner, role: 'planner', organisation: { kind: 'agency' } })
    const cookie = String(res.headers['set-cookie'])
    expect(cookie).toMatch(/fanlight_session=/)
    expect(cookie).toMatch(/HttpOnly/i)
    expect(cookie).toMatch(/SameSite=Lax/i)
    expect(cookie).not.toMatch(/Secure/i)
  })

  it('gives the same 401 for an unknown e-mail and a wrong password', async () => {
    const a = await request(t.app).post('/api/auth/login').send({ email: 'nobody@fanlight.test', password: 'x' }).expect(401)
    const b = await request(t.app).post('/api/auth/login').send({ email: DEMO_EMAIL.planner, password: 'wrong' }).expect(401)
    expect(a.body).toEqual(b.body)
    expect(a.headers['set-cookie']).toBeUndefined()
  })

  it('rejects an invalid body with the field paths', async () => {
    const res = await request(t.app).post('/api/auth/login').send({ email: 'not-an-email', password: '', extra: true }).expect(422)
    const paths = res.body.issues.map((i: { path: string[] }) => i.path.join('.'))
    expect(paths).toEqual(expect.arrayContaining(['email', 'password', '']))
    expect(JSON.stringify(res.body.issues)).toContain('extra')
  })

  it('rejects malformed JSON with 400 and oversize bodies with 413', async () => {
    await request(t.app).post('/api/auth/login').set('content-type', 'application/json').send('{"email": ').expect(400)
    const big = JSON.stringify({ email: 'a@b.cd', password: 'x'.repeat(2_000_000) })
    await request(t.app).post('/api/auth/login').set('content-type', 'application/json').send(big).expect(413)
  })

  it('refuses a request from another site', async () => {
    await request(t.app).post('/api/auth/login').set('Origin', 'https://elsewhere.example')
      .send({ email: DEMO_EMAIL.planner, password: DEMO_PASSWORD }).expect(403)
  })

  it('limits repeated attempts', async () => {
    const limited = await startTestApp({ loginRateLimit: { windowMs: 60_000, limit: 3 } })
    try {
      for (let i = 0; i < 3; i++) await request(limited.app).post('/api/auth/login').send({ email: DEMO_EMAIL.admin, password: 'bad' }).expect(401)
      const res = await request(limited.app).post('/api/auth/login').send({ email: DEMO_EMAIL.admin, password: DEMO_PASSWORD }).expect(429)
      expect(res.body.error).toBe('rate_limited')
    } finally { await limited.close() }
  })
})

describe('GET /api/auth/me and logout', () => {
  it('returns the user with the organisation, then 401 after logout', async () => {
    const agent = request.agent(t.app)
    await agent.post('/api/auth/login').send({ email: DEMO_EMAIL.engineer2, password: DEMO_PASSWORD }).expect(200)
    const me = await agent.get('/api/auth/me').expect(200)
    expect(me.body.user).toMatchObject({ role: 'engineer', organisation: { name: 'City of Osterfield', kind: 'city' } })
    await agent.post('/api/auth/logout').expect(204)
    await agent.get('/api/auth/me').expect(401)
  })

  it('is 401 without a cookie and with a forged one', async () => {
    await request(t.app).get('/api/auth/me').expect(401)
    await request(t.app).get('/api/auth/me').set('Cookie', 'fanlight_session=forged').expect(401)
  })

  it('is 401 once the session has expired', async () => {
    const agent = request.agent(t.app)
    await agent.post('/api/auth/login').send({ email: DEMO_EMAIL.manager, password: DEMO_PASSWORD }).expect(200)
    await t.database.db.update(sessions).set({ expiresAt: new Date(Date.now() - 1000) }).where(eq(sessions.userId, 'user-manager'))
    await agent.get('/api/auth/me').expect(401)
  })

  it('ends the session of a deactivated user', async () => {
    const agent = request.agent(t.app)
    await agent.post('/api/auth/login').send({ email: DEMO_EMAIL.engineer2, password: DEMO_PASSWORD }).expect(200)
    await t.database.db.update(users).set({ active: false }).where(eq(users.id, 'user-engineer2'))
    await agent.get('/api/auth/me').expect(401)
    await request(t.app).post('/api/auth/login').send({ email: DEMO_EMAIL.engineer2, password: DEMO_PASSWORD }).expect(401)
    await t.database.db.update(users).set({ active: true }).where(eq(users.id, 'user-engineer2'))
  })
})

describe('unknown API routes', () => {
  it('answer 404 in JSON', async () => {
    const res = await request(t.app).get('/api/nothing-here').expect(404)
    expect(res.body.error).toBe('not_found')
  })
})

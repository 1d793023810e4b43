import request from 'supertest'
import type { Express } from 'express'
import { sql } from 'drizzle-orm'
import { openDatabase, type Database } from '../../server/db'
import { createApp, type AppOptions } from '../../server/app'
import { createSmtpMailer, type Mailer } from '../../server/services/mail'
import { startFakeSmtp, type FakeSmtp } from '../../server/services/fake-smtp'
import { seedDemo } from '../../server/seed/demo'
import type { Role } from '../../shared/roles'

export const DEMO_PASSWORD = 'fanlight-demo'
export const DEMO_EMAIL: Record<'planner' | 'engineer' | 'engineer2' | 'manager' | 'admin', string> = {
  planner: 'planner@fanlight.test',
  engineer: 'engineer@fanlight.test',
  engineer2: 'engineer2@fanlight.test',
  manager: 'manager@fanlight.test',
  admin: 'admin@fanlight.test',
}
export type DemoAccount = keyof typeof DEMO_EMAIL

export interface TestApp {
  app: Express
  database: Database
  mailer: Mailer
  smtp: FakeSmtp
  /** A supertest agent signed in as one of the demo accounts (cookie kept). */
  as(account: DemoAccount): Promise<ReturnType<typeof request.agent>>
  /** Empties every table and re-seeds the demo people (one database per test file). */
  reset(): Promise<void>
  close(): Promise<void>
}

/**
 * The real app over a real in-memory PGlite with the real migrations and the local fake SMTP.
 * Build one per test file (PGlite start-up costs seconds) and call reset() between tests when needed.
 */
export async function startTestApp(overrides: Partial<AppOptions> = {}): Promise<TestApp> {
  const database = await openDatabase('memory')
  const smtp = await startFakeSmtp(database.db)
  const mailer = createSmtpMailer(smtp.url)
  await seedDemo(database.db, { password: DEMO_PASSWORD })
  const app = createApp({ db: database.db, mailer, clientDir: null, loginRateLimit: { windowMs: 60_000, limit: 1000 }, ...overrides })
  const agents = new Map<DemoAccount, ReturnType<typeof request.agent>>()
  return {
    app,
    database,
    mailer,
    smtp,
    async as(account) {
      const cached = agents.get(account)
      if (cached) return cached
      const agent = request.agent(app)
      await agent.post('/api/auth/login').send({ email: DEMO_EMAIL[account], password: DEMO_PASSWORD }).expect(200)
      agents.set(account, agent)
      return agent
    },
    async reset() {
      agents.clear()
      const { rows } = await database.client.query<{ tablename: string }>(
        `select tablename from pg_tables where schemaname = 'public'`,
      )
      if (rows.length) await database.db.execute(sql.raw(`truncate ${rows.map((r) => `"${r.tablename}"`).join(', ')} restart identity cascade`))
      await seedDemo(database.db, { password: DEMO_PASSWORD })
    },
    async close() {
      mailer.close()
      await smtp.close()
      await database.close()
    },
  }
}

export const ALL_ROLES: Role[] = ['planner', 'engineer', 'manager', 'admin']
/** One demo account per role, for "every other role gets 403" loops. */
export const ACCOUNT_OF_ROLE: Record<Role, DemoAccount> = { planner: 'planner', engineer: 'engineer', manager: 'manager', admin: 'admin' }

/** Polls a job until it leaves queued/running. */
export async function waitForJob(agent: ReturnType<typeof request.agent>, jobId: string, timeoutMs = 60_000) {
  const start = Date.now()
  for (;;) {
    const res = await agent.get(`/api/jobs/${jobId}`).expect(200)
    if (res.body.state === 'succeeded' || res.body.state === 'failed') return res.body
    if (Date.now() - start > timeoutMs) throw new Error(`job ${jobId} still ${res.body.state} after ${timeoutMs} ms`)
    await new Promise((r) => setTimeout(r, 100))
  }
}

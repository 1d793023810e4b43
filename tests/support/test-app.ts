import request from 'supertest'
import type { Express } from 'express'
import { openDatabase, type Database } from '../../server/db'
import { createApp, type AppOptions } from '../../server/app'
import { createSmtpMailer, type Mailer } from '../../server/services/mail'
import { startFakeSmtp, type FakeSmtp } from '../../server/services/fake-smtp'
import { DEMO_PASSWORD, seedSnapshot } from './seed-snapshot'
import type { Role } from '../../shared/roles'

export { DEMO_PASSWORD }
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
  /** Starts again from the freshly seeded demo scenario (one database per test file, reset between tests). */
  reset(): Promise<void>
  close(): Promise<void>
}

/**
 * The real app over a real in-memory PGlite with the real migrations, the seeded demo scenario and
 * the local fake SMTP. Build one per test file and call reset() between tests when needed; both
 * start from a dump of the seeded database, made once per run by the global setup.
 */
export async function startTestApp(overrides: Partial<AppOptions> = {}): Promise<TestApp> {
  const agents = new Map<DemoAccount, ReturnType<typeof request.agent>>()
  async function build() {
    const database = await openDatabase('memory', { loadDataDir: await seedSnapshot() })
    const smtp = await startFakeSmtp(database.db)
    const mailer = createSmtpMailer(smtp.url)
    const app = createApp({ db: database.db, mailer, clientDir: null, loginRateLimit: { windowMs: 60_000, limit: 1000 }, ...overrides })
    return { database, smtp, mailer, app }
  }
  async function teardown(parts: { database: Database; smtp: FakeSmtp; mailer: Mailer }) {
    parts.mailer.close()
    await parts.smtp.close()
    await parts.database.close()
  }
  const t: TestApp = {
    ...(await build()),
    async as(account) {
      const cached = agents.get(account)
      if (cached) return cached
      const agent = request.agent(t.app)
      await agent.post('/api/auth/login').send({ email: DEMO_EMAIL[account], password: DEMO_PASSWORD }).expect(200)
      agents.set(account, agent)
      return agent
    },
    async reset() {
      agents.clear()
      await teardown(t)
      Object.assign(t, await build())
    },
    close: () => teardown(t),
  }
  return t
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

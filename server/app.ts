import { existsSync } from 'node:fs'
import { fileURLToPath } from 'node:url'
import path from 'node:path'
import express from 'express'
import helmet from 'helmet'
import compression from 'compression'
import type { Db } from './db'
import type { Mailer } from './services/mail'
import { systemClock, type Clock } from './clock'
import type { AppContext } from './context'
import { createLucia } from './auth/lucia'
import { loadSession } from './auth/middleware'
import { errorHandler } from './middleware/error-handler'
import { originCheck } from './middleware/origin-check'
import { NotFound } from './errors'
import { healthRouter } from './routes/health'
import { authRouter } from './routes/auth'
import { organisationsRouter, usersRouter } from './routes/users'
import { outboxRouter } from './routes/outbox'
import { jobsRouter } from './routes/jobs'
import { intersectionsRouter } from './routes/intersections'
import { corridorsRouter } from './routes/corridors'
import { feedsRouter } from './routes/feeds'
import { proposalsRouter } from './routes/proposals'
import { realtimeRouter } from './routes/realtime'
import { modelRouter } from './routes/model'
import { dashboardRouter, proposalReportRouter } from './routes/dashboard'
import { sweepRouter } from './routes/sweep'
import { suggestRouter } from './routes/suggest'
import { citiesRouter } from './routes/cities'
import type { GtfsLimits } from './services/gtfs/limits'

export interface AppOptions {
  db: Db
  mailer: Mailer
  clock?: Clock
  /** Secure cookies (HTTPS only); on in production. */
  secureCookies?: boolean
  loginRateLimit?: { windowMs: number; limit: number }
  publicUrl?: string
  /** Folder of the built client; served with a single-page fallback when it exists. */
  clientDir?: string | null
  /** Caps on GTFS uploads; tests lower them to exercise the zip-bomb checks. */
  gtfsLimits?: Partial<GtfsLimits>
}

const defaultClientDir = fileURLToPath(new URL('../dist', import.meta.url))

export function createApp(options: AppOptions) {
  const lucia = createLucia(options.db, options.secureCookies ?? false)
  const ctx: AppContext = {
    db: options.db,
    lucia,
    mailer: options.mailer,
    clock: options.clock ?? systemClock,
    loginRateLimit: options.loginRateLimit ?? { windowMs: 5 * 60_000, limit: 20 },
    publicUrl: (req) => options.publicUrl ?? `${req.protocol}://${req.get('host')}`,
    gtfsLimits: options.gtfsLimits ?? {},
  }

  const app = express()
  app.disable('x-powered-by')
  app.set('trust proxy', 'loopback')
  app.use(helmet({
    contentSecurityPolicy: {
      directives: {
        // PrimeVue injects its theme as <style> elements at run time.
        'style-src': ["'self'", "'unsafe-inline'"],
        'img-src': ["'self'", 'data:', 'blob:'],
        'font-src': ["'self'", 'data:'],
        'upgrade-insecure-requests': options.secureCookies ? [] : null,
      },
    },
  }))
  // Sweeps and time-space fields are megabytes of JSON; they compress about tenfold.
  app.use(compression())
  app.use('/api', express.json({ limit: '1mb' }))
  app.use('/api', originCheck)
  app.use('/api', loadSession(lucia))

  app.use('/api/health', healthRouter())
  app.use('/api/auth', authRouter(ctx))
  app.use('/api/users', usersRouter(ctx))
  app.use('/api/organisations', organisationsRouter(ctx))
  app.use('/api/outbox', outboxRouter(ctx))
  app.use('/api/jobs', jobsRouter(ctx))
  app.use('/api/intersections', intersectionsRouter(ctx))
  app.use('/api/corridors', corridorsRouter(ctx))
  app.use('/api/feeds', feedsRouter(ctx))
  app.use('/api/proposals', proposalReportRouter(ctx))
  app.use('/api/proposals', proposalsRouter(ctx))
  app.use('/api/proposals', suggestRouter(ctx))
  app.use('/api/realtime', realtimeRouter(ctx))
  app.use('/api/model/sweep', sweepRouter(ctx))
  app.use('/api/model', modelRouter())
  app.use('/api/dashboard', dashboardRouter(ctx))
  app.use('/api/cities', citiesRouter(ctx))

  app.use('/api', (_req, _res, next) => next(new NotFound('API route')))

  const clientDir = options.clientDir === undefined ? defaultClientDir : options.clientDir
  if (clientDir && existsSync(path.join(clientDir, 'index.html'))) {
    app.use(express.static(clientDir, { index: false, maxAge: '1h' }))
    app.get('/{*splat}', (_req, res) => { res.sendFile(path.join(clientDir, 'index.html')) })
  }

  app.use(errorHandler)
  return app
}

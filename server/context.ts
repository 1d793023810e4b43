import type { Request } from 'express'
import type { Db } from './db'
import type { AppLucia } from './auth/lucia'
import type { Mailer } from './services/mail'
import type { Clock } from './clock'
import type { GtfsLimits } from './services/gtfs/limits'

/** What every router and service may use; built once by createApp. */
export interface AppContext {
  db: Db
  lucia: AppLucia
  mailer: Mailer
  clock: Clock
  loginRateLimit: { windowMs: number; limit: number }
  /** Where links in e-mails point: PUBLIC_URL, else the request's own origin. */
  publicUrl(req: Request): string
  /** Caps on GTFS uploads (zip bombs, sizes); defaults in services/gtfs/limits.ts. */
  gtfsLimits: Partial<GtfsLimits>
}

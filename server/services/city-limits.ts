// Each city's limits for priority at its signals: read by everyone signed in, written by the
// city's own engineers (or an admin) naming the version they read.
import { and, eq, sql } from 'drizzle-orm'
import type { User } from 'lucia'
import type { Db, Tx } from '../db'
import { cityLimits, organisations, users } from '../db/schema'
import { Conflict, Forbidden, NotFound } from '../errors'
import { NO_CITY_LIMITS, type CityLimits, type CityLimitsDto, type CityLimitsPutBody } from '../../shared/schemas/city-limits'

type DbOrTx = Db | Tx
type LimitsRow = typeof cityLimits.$inferSelect

const limitsOf = (r: LimitsRow | undefined): CityLimits => (r
  ? { maxCrossVc: r.maxCrossVc, worstLos: r.worstLos, maxExtensionS: r.maxExtensionS, maxEarlyGreenS: r.maxEarlyGreenS, minLockoutCycles: r.minLockoutCycles }
  : NO_CITY_LIMITS)

async function cityOf(db: DbOrTx, orgId: string) {
  const [org] = await db.select({ id: organisations.id, name: organisations.name, kind: organisations.kind }).from(organisations).where(eq(organisations.id, orgId))
  if (!org || org.kind !== 'city') throw new NotFound('City')
  return org
}

/** The city's limits; no limit beyond the timing's own minimums while it has set none. */
export async function getCityLimits(db: DbOrTx, orgId: string): Promise<CityLimitsDto> {
  const city = await cityOf(db, orgId)
  const [row] = await db.select({ l: cityLimits, by: users.name }).from(cityLimits)
    .leftJoin(users, eq(cityLimits.updatedBy, users.id)).where(eq(cityLimits.orgId, orgId))
  return {
    orgId: city.id,
    cityName: city.name,
    ...limitsOf(row?.l),
    version: row?.l.version ?? 0,
    updatedAt: row?.l.updatedAt.toISOString() ?? null,
    updatedBy: row?.l.updatedBy && row.by ? { id: row.l.updatedBy, name: row.by } : null,
  }
}

/** Limits only, for the recommender: a missing city has none. */
export async function limitsForCity(db: DbOrTx, orgId: string): Promise<CityLimits> {
  const [row] = await db.select().from(cityLimits).where(eq(cityLimits.orgId, orgId))
  return limitsOf(row)
}

export function assertMaySetLimits(actor: User, orgId: string, cityName: string): void {
  if (actor.role === 'admin') return
  if (actor.role !== 'engineer' || actor.organisationId !== orgId) throw new Forbidden(`Only traffic engineers of ${cityName} (or an admin) may set its limits.`)
}

export async function putCityLimits(db: DbOrTx, actor: User, orgId: string, body: CityLimitsPutBody): Promise<CityLimitsDto> {
  const city = await cityOf(db, orgId)
  assertMaySetLimits(actor, orgId, city.name)
  const { version, ...limits } = body
  const stale = async () => new Conflict('Someone changed these limits since you opened them. Here they are as they are now.', { limits: await getCityLimits(db, orgId) })
  if (version === 0) {
    const [inserted] = await db.insert(cityLimits).values({ orgId, ...limits, updatedBy: actor.id }).onConflictDoNothing().returning({ v: cityLimits.version })
    if (!inserted) throw await stale()
  } else {
    const [updated] = await db.update(cityLimits).set({ ...limits, version: sql`${cityLimits.version} + 1`, updatedAt: sql`now()`, updatedBy: actor.id })
      .where(and(eq(cityLimits.orgId, orgId), eq(cityLimits.version, version))).returning({ v: cityLimits.version })
    if (!updated) throw await stale()
  }
  return getCityLimits(db, orgId)
}

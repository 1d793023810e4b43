// Row <-> DTO mapping and the small queries every signal service needs.
import { asc, eq, inArray } from 'drizzle-orm'
import type { Db, Tx } from '../../db'
import { intersections, organisations, timingPlans } from '../../db/schema'
import { NotFound, Unprocessable } from '../../errors'
import { minutesOfDay } from '../../../shared/signals/time-of-day'
import type { IntersectionDto, TimingPlanDto } from '../../../shared/schemas/signals'

export type DbOrTx = Db | Tx
export type IntersectionRow = typeof intersections.$inferSelect
export type TimingPlanRow = typeof timingPlans.$inferSelect

export function planDto(p: TimingPlanRow): TimingPlanDto {
  return {
    id: p.id, intersectionId: p.intersectionId, name: p.name, dayTypes: [...p.dayTypes], startTime: p.startTime, endTime: p.endTime,
    cycleS: p.cycleS, busGreenS: p.busGreenS, yellowS: p.yellowS, redClearanceS: p.redClearanceS, crossMinGreenS: p.crossMinGreenS,
    pedWalkS: p.pedWalkS, pedClearanceS: p.pedClearanceS, offsetS: p.offsetS, pedConcurrent: p.pedConcurrent,
    version: p.version, updatedAt: p.updatedAt.toISOString(),
  }
}

export const byStartTime = (a: { startTime: string; name: string }, b: { startTime: string; name: string }) =>
  minutesOfDay(a.startTime) - minutesOfDay(b.startTime) || a.name.localeCompare(b.name)

function intersectionDto(row: IntersectionRow, jurisdictionName: string, plans: TimingPlanRow[]): IntersectionDto {
  return {
    id: row.id, name: row.name, lat: row.lat, lon: row.lon, jurisdictionId: row.jurisdictionId, jurisdictionName,
    crossingDistanceM: row.crossingDistanceM, minPedWalkS: row.minPedWalkS, version: row.version,
    updatedAt: row.updatedAt.toISOString(), plans: plans.map(planDto).sort(byStartTime),
  }
}

/** Intersections with their jurisdiction's name and their plans, in one round trip per table. */
export async function loadIntersectionDtos(db: DbOrTx, rows: IntersectionRow[]): Promise<IntersectionDto[]> {
  if (!rows.length) return []
  const ids = rows.map((r) => r.id)
  const plans = await db.select().from(timingPlans).where(inArray(timingPlans.intersectionId, ids)).orderBy(asc(timingPlans.name))
  const orgs = await db.select({ id: organisations.id, name: organisations.name }).from(organisations)
    .where(inArray(organisations.id, [...new Set(rows.map((r) => r.jurisdictionId))]))
  const orgName = new Map(orgs.map((o) => [o.id, o.name]))
  return rows.map((r) => intersectionDto(r, orgName.get(r.jurisdictionId) ?? r.jurisdictionId, plans.filter((p) => p.intersectionId === r.id)))
}

export async function intersectionRow(db: DbOrTx, id: string): Promise<IntersectionRow> {
  const [row] = await db.select().from(intersections).where(eq(intersections.id, id))
  if (!row) throw new NotFound('Intersection')
  return row
}

export async function getIntersection(db: DbOrTx, id: string): Promise<IntersectionDto> {
  const [dto] = await loadIntersectionDtos(db, [await intersectionRow(db, id)])
  return dto
}

/** Jurisdictions are organisations of kind 'city'. Returns the city's name. */
export async function assertCity(db: DbOrTx, jurisdictionId: string, path: (string | number)[] = ['jurisdictionId']): Promise<string> {
  const [org] = await db.select().from(organisations).where(eq(organisations.id, jurisdictionId))
  if (!org || org.kind !== 'city') throw new Unprocessable('The jurisdiction must be a city.', [{ path, message: `No city with id "${jurisdictionId}".` }])
  return org.name
}

// Signal assets: create, read, change and delete intersections (with their plans on create).
import { randomUUID } from 'node:crypto'
import type { User } from 'lucia'
import { and, asc, eq, ilike, sql, type SQL } from 'drizzle-orm'
import { corridorApproaches, corridors, intersections, proposalRows, proposals, timingPlans } from '../../db/schema'
import { Conflict, Unprocessable } from '../../errors'
import type { IntersectionBody, IntersectionDto, IntersectionPatchBody, TimingPlanBody } from '../../../shared/schemas/signals'
import { intersectionBody } from '../../../shared/schemas/signals'
import { assertMayEditSignal } from './access'
import { assertCity, getIntersection, intersectionRow, loadIntersectionDtos, type DbOrTx, type IntersectionRow } from './rows'
import { assertPlansValid } from './validation'

export { getIntersection } from './rows'

export interface IntersectionFilter { jurisdictionId?: string; q?: string }

export async function listIntersections(db: DbOrTx, filter: IntersectionFilter = {}): Promise<IntersectionDto[]> {
  const where: SQL[] = []
  if (filter.jurisdictionId) where.push(eq(intersections.jurisdictionId, filter.jurisdictionId))
  if (filter.q) where.push(ilike(intersections.name, `%${filter.q.replace(/[%_\\]/g, (c) => `\\${c}`)}%`))
  const rows = await db.select().from(intersections).where(and(...where)).orderBy(asc(intersections.name))
  return loadIntersectionDtos(db, rows)
}

async function assertNameFree(db: DbOrTx, jurisdictionId: string, name: string, exceptId?: string) {
  const [clash] = await db.select({ id: intersections.id }).from(intersections)
    .where(and(eq(intersections.jurisdictionId, jurisdictionId), sql`lower(${intersections.name}) = lower(${name})`))
  if (clash && clash.id !== exceptId) {
    throw new Unprocessable('The name is taken.', [{ path: ['name'], message: `This city already has an intersection called "${name}".` }])
  }
}

export function planValues(p: TimingPlanBody) {
  return {
    name: p.name, dayTypes: p.dayTypes, startTime: p.startTime, endTime: p.endTime, cycleS: p.cycleS, busGreenS: p.busGreenS,
    yellowS: p.yellowS, redClearanceS: p.redClearanceS, crossMinGreenS: p.crossMinGreenS, pedWalkS: p.pedWalkS,
    pedClearanceS: p.pedClearanceS, offsetS: p.offsetS, pedConcurrent: p.pedConcurrent,
  }
}

/** Creates an intersection and its plans in one transaction; every plan is checked first. */
export async function createIntersection(db: DbOrTx, actor: User, input: IntersectionBody): Promise<IntersectionDto> {
  const body = intersectionBody.parse(input)
  await assertCity(db, body.jurisdictionId)
  assertMayEditSignal(actor, body.jurisdictionId, 'the signals of this city')
  await assertNameFree(db, body.jurisdictionId, body.name)
  assertPlansValid(body, body.plans, (i) => ['plans', i])
  const id = randomUUID()
  await db.transaction(async (tx) => {
    await tx.insert(intersections).values({
      id, name: body.name, lat: body.lat, lon: body.lon, jurisdictionId: body.jurisdictionId,
      crossingDistanceM: body.crossingDistanceM, minPedWalkS: body.minPedWalkS, updatedBy: actor.id,
    })
    if (body.plans.length) {
      await tx.insert(timingPlans).values(body.plans.map((p) => ({ id: randomUUID(), intersectionId: id, ...planValues(p), updatedBy: actor.id })))
    }
  })
  return getIntersection(db, id)
}

export async function staleConflict(db: DbOrTx, id: string): Promise<Conflict> {
  return new Conflict('Someone else changed this intersection since you opened it. Here is the current version.', { current: await getIntersection(db, id) })
}

export async function patchIntersection(db: DbOrTx, actor: User, id: string, body: IntersectionPatchBody): Promise<IntersectionDto> {
  const row = await intersectionRow(db, id)
  assertMayEditSignal(actor, row.jurisdictionId)
  if (body.jurisdictionId && body.jurisdictionId !== row.jurisdictionId) {
    await assertCity(db, body.jurisdictionId)
    assertMayEditSignal(actor, body.jurisdictionId, 'the signals of the new city')
  }
  if (body.version !== row.version) throw await staleConflict(db, id)
  const { version, ...changes } = body
  const next: IntersectionRow = { ...row, ...changes }
  if (changes.name !== undefined || changes.jurisdictionId !== undefined) await assertNameFree(db, next.jurisdictionId, next.name, id)
  if (changes.crossingDistanceM !== undefined || changes.minPedWalkS !== undefined) {
    const plans = await db.select().from(timingPlans).where(eq(timingPlans.intersectionId, id))
    assertPlansValid(next, plans, () => null, [changes.crossingDistanceM !== undefined ? 'crossingDistanceM' : 'minPedWalkS'])
  }
  const [updated] = await db.update(intersections)
    .set({ ...changes, version: sql`${intersections.version} + 1`, updatedAt: sql`now()`, updatedBy: actor.id })
    .where(and(eq(intersections.id, id), eq(intersections.version, version))).returning({ id: intersections.id })
  if (!updated) throw await staleConflict(db, id)
  return getIntersection(db, id)
}

/**
 * Deletes an intersection and its plans. Refused (409) while a corridor approach uses it:
 * proposals and their decisions hang off approaches.
 */
export async function deleteIntersection(db: DbOrTx, actor: User, id: string, version?: number): Promise<void> {
  const row = await intersectionRow(db, id)
  assertMayEditSignal(actor, row.jurisdictionId)
  if (version !== undefined && version !== row.version) throw await staleConflict(db, id)
  const users = await intersectionUsage(db, id)
  if (users.length) throw new Conflict(`In use by ${users.join(', ')}. Remove those first.`)
  await db.delete(intersections).where(eq(intersections.id, id))
}

/**
 * What still refers to the intersection: corridors with an approach there, and proposals with a
 * row for it (kept after an approach is removed, since their decisions are a record).
 */
export async function intersectionUsage(db: DbOrTx, id: string): Promise<string[]> {
  const used = await db.selectDistinct({ name: corridors.name }).from(corridorApproaches)
    .innerJoin(corridors, eq(corridorApproaches.corridorId, corridors.id)).where(eq(corridorApproaches.intersectionId, id))
  const proposed = await db.selectDistinct({ name: proposals.name }).from(proposalRows)
    .innerJoin(proposals, eq(proposalRows.proposalId, proposals.id)).where(eq(proposalRows.intersectionId, id))
  return [...used.map((r) => r.name), ...proposed.map((r) => `proposal “${r.name}”`)].sort()
}

// Timing plans of one intersection: every write is checked against the shared timing rules and
// against the intersection's other plans, and names the version it read.
import { randomUUID } from 'node:crypto'
import type { User } from 'lucia'
import { and, eq, ne, sql } from 'drizzle-orm'
import { timingPlans } from '../../db/schema'
import { Conflict, NotFound } from '../../errors'
import type { TimingPlanBody, TimingPlanDto, TimingPlanPatchBody } from '../../../shared/schemas/signals'
import { assertMayEditSignal } from './access'
import { intersectionRow, planDto, byStartTime, type DbOrTx } from './rows'
import { assertPlanValid } from './validation'
import { planValues } from './intersections'

export async function listTimingPlans(db: DbOrTx, intersectionId: string): Promise<TimingPlanDto[]> {
  await intersectionRow(db, intersectionId)
  const rows = await db.select().from(timingPlans).where(eq(timingPlans.intersectionId, intersectionId))
  return rows.map(planDto).sort(byStartTime)
}

async function planRow(db: DbOrTx, intersectionId: string, planId: string) {
  const [row] = await db.select().from(timingPlans).where(and(eq(timingPlans.id, planId), eq(timingPlans.intersectionId, intersectionId)))
  if (!row) throw new NotFound('Timing plan')
  return row
}

async function stalePlan(db: DbOrTx, intersectionId: string, planId: string): Promise<Conflict> {
  return new Conflict('Someone else changed this timing plan since you opened it. Here is the current version.', {
    current: planDto(await planRow(db, intersectionId, planId)),
  })
}

export async function createTimingPlan(db: DbOrTx, actor: User, intersectionId: string, body: TimingPlanBody): Promise<TimingPlanDto> {
  const signal = await intersectionRow(db, intersectionId)
  assertMayEditSignal(actor, signal.jurisdictionId)
  const others = await db.select().from(timingPlans).where(eq(timingPlans.intersectionId, intersectionId))
  assertPlanValid(signal, others, body)
  const [row] = await db.insert(timingPlans).values({ id: randomUUID(), intersectionId, ...planValues(body), updatedBy: actor.id }).returning()
  return planDto(row)
}

export async function patchTimingPlan(db: DbOrTx, actor: User, intersectionId: string, planId: string, body: TimingPlanPatchBody): Promise<TimingPlanDto> {
  const signal = await intersectionRow(db, intersectionId)
  assertMayEditSignal(actor, signal.jurisdictionId)
  const row = await planRow(db, intersectionId, planId)
  if (body.version !== row.version) throw await stalePlan(db, intersectionId, planId)
  const { version, ...changes } = body
  const others = await db.select().from(timingPlans).where(and(eq(timingPlans.intersectionId, intersectionId), ne(timingPlans.id, planId)))
  assertPlanValid(signal, others, { ...row, ...changes })
  const [updated] = await db.update(timingPlans)
    .set({ ...changes, version: sql`${timingPlans.version} + 1`, updatedAt: sql`now()`, updatedBy: actor.id })
    .where(and(eq(timingPlans.id, planId), eq(timingPlans.version, version))).returning()
  if (!updated) throw await stalePlan(db, intersectionId, planId)
  return planDto(updated)
}

export async function deleteTimingPlan(db: DbOrTx, actor: User, intersectionId: string, planId: string, version?: number): Promise<void> {
  const signal = await intersectionRow(db, intersectionId)
  assertMayEditSignal(actor, signal.jurisdictionId)
  const row = await planRow(db, intersectionId, planId)
  if (version !== undefined && version !== row.version) throw await stalePlan(db, intersectionId, planId)
  await db.delete(timingPlans).where(eq(timingPlans.id, planId))
}

// The savings inputs of a corridor as they apply: the corridor's own row, else the agency's
// defaults, else Fanlight's (shared/savings/inputs.ts), and their edits by planners and admins.
import { randomUUID } from 'node:crypto'
import { and, eq, isNull } from 'drizzle-orm'
import type { User } from 'lucia'
import type { DbOrTx } from '../signals/rows'
import { organisations, savingsInputs } from '../../db/schema'
import { Conflict, Forbidden, Unprocessable } from '../../errors'
import { corridorRow } from '../corridors/rows'
import { defaultSavingsInputs } from '../../../shared/savings/inputs'
import { mayEditCorridor } from '../../../shared/corridors/permissions'
import type { SavingsInputsBody, SavingsInputsDto } from '../../../shared/schemas/savings'

type InputsRow = typeof savingsInputs.$inferSelect

/** Planners of the agency and admins; managers and engineers read. */
export const mayEditInputs = (actor: Pick<User, 'role' | 'organisationId'>, agencyId: string) => mayEditCorridor(actor, agencyId)

function dto(row: InputsRow | null, source: SavingsInputsDto['source'], agencyId: string, corridorId: string | null, actor: User, year: number): SavingsInputsDto {
  const values = row
    ? { defaultLoad: row.defaultLoad, loads: row.loads, costPerRevenueHour: row.costPerRevenueHour, currency: row.currency, costYear: row.costYear, layoverShare: row.layoverShare }
    : defaultSavingsInputs(year)
  return {
    ...values, source, agencyId, corridorId,
    version: row?.version ?? null, updatedAt: row?.updatedAt.toISOString() ?? null, updatedBy: row?.updatedBy ?? null,
    mayEdit: mayEditInputs(actor, agencyId),
  }
}

async function rowOf(db: DbOrTx, agencyId: string, corridorId: string | null): Promise<InputsRow | null> {
  const [row] = await db.select().from(savingsInputs)
    .where(and(eq(savingsInputs.agencyId, agencyId), corridorId ? eq(savingsInputs.corridorId, corridorId) : isNull(savingsInputs.corridorId)))
  return row ?? null
}

/** What applies to the corridor (or, without one, the agency's defaults). */
export async function effectiveInputs(db: DbOrTx, actor: User, agencyId: string, corridorId: string | null, year: number): Promise<SavingsInputsDto> {
  if (corridorId) {
    const own = await rowOf(db, agencyId, corridorId)
    if (own) return dto(own, 'corridor', agencyId, corridorId, actor, year)
  }
  const agency = await rowOf(db, agencyId, null)
  return dto(agency, agency ? 'agency' : 'default', agencyId, corridorId, actor, year)
}

/** The inputs a reader asks for: a corridor's, or the agency of the reader's organisation. */
export async function getInputs(db: DbOrTx, actor: User, corridorId: string | undefined, year: number): Promise<SavingsInputsDto> {
  if (corridorId) {
    const corridor = await corridorRow(db, corridorId)
    return effectiveInputs(db, actor, corridor.agencyId, corridor.id, year)
  }
  return effectiveInputs(db, actor, await agencyOf(db, actor), null, year)
}

async function agencyOf(db: DbOrTx, actor: User): Promise<string> {
  const [org] = await db.select({ kind: organisations.kind }).from(organisations).where(eq(organisations.id, actor.organisationId))
  if (org?.kind !== 'agency') {
    throw new Unprocessable('Give a corridor: your organisation is not a transit agency.', [{ path: ['corridorId'], message: 'Required for people of a city.' }])
  }
  return actor.organisationId
}

/**
 * Writes the corridor's or the agency's inputs. A first write gives no version; later writes
 * name the version they read and lose (409, with the current values) if someone wrote since.
 */
export async function putInputs(db: DbOrTx, actor: User, body: Omit<SavingsInputsBody, 'corridorId'> & { corridorId: string | null }, year: number): Promise<SavingsInputsDto> {
  const corridor = body.corridorId ? await corridorRow(db, body.corridorId) : null
  const agencyId = corridor?.agencyId ?? await agencyOf(db, actor)
  if (!mayEditInputs(actor, agencyId)) throw new Forbidden('Only the planners of the agency and administrators may change the savings inputs.')
  const values = {
    defaultLoad: body.defaultLoad, loads: body.loads, costPerRevenueHour: body.costPerRevenueHour, currency: body.currency,
    costYear: body.costYear, layoverShare: body.layoverShare, updatedBy: actor.id, updatedAt: new Date(),
  }
  const current = await rowOf(db, agencyId, corridor?.id ?? null)
  const stale = async () => new Conflict('Someone changed these inputs since you opened them. Here are the current values.', {
    current: await effectiveInputs(db, actor, agencyId, corridor?.id ?? null, year),
  })
  if (!current) {
    if (body.version !== undefined) throw await stale()
    const inserted = await db.insert(savingsInputs).values({ id: randomUUID(), agencyId, corridorId: corridor?.id ?? null, ...values })
      .onConflictDoNothing().returning()
    if (!inserted.length) throw await stale()
    return dto(inserted[0], corridor ? 'corridor' : 'agency', agencyId, corridor?.id ?? null, actor, year)
  }
  if (body.version === undefined || body.version !== current.version) throw await stale()
  const [updated] = await db.update(savingsInputs).set({ ...values, version: current.version + 1 })
    .where(and(eq(savingsInputs.id, current.id), eq(savingsInputs.version, current.version))).returning()
  if (!updated) throw await stale()
  return dto(updated, corridor ? 'corridor' : 'agency', agencyId, corridor?.id ?? null, actor, year)
}

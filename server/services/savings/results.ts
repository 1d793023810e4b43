// The stored results of a proposal's rows as the savings use them: per row the figures of its
// current run (the newest that covered it), with the pieces of the model's output the
// aggregation needs: the person-delay terms and the delay-by-phase table. Those pieces are read
// out of the stored output once per run and row and kept (savings_result_digests): a run's
// results never change.
import { and, asc, eq, inArray, sql } from 'drizzle-orm'
import type { DbOrTx } from '../signals/rows'
import {
  corridorApproaches, intersections, organisations, proposalEvaluations, proposalResults, proposalRows, savingsResultDigests,
} from '../../db/schema'
import { latestRuns } from '../proposals/dto'
import { settingsOf } from '../proposals/records'
import { sameSettings } from '../../../shared/proposals/settings'
import type { RowSettings } from '../../../shared/schemas/proposals'
import { resultKey, type PeriodFigures, type RowFigures } from '../../../shared/savings/corridor-model'

export interface EvaluatedRows {
  rows: RowFigures[]
  /** When the newest run used finished; null when no row has figures. */
  evaluatedAt: string | null
}

/** One row's figures in one run. */
interface ResultDigest {
  settings: RowSettings | null
  figures: Record<string, PeriodFigures | null>
}

// Delays to 0.1 s: the distributions bin them by the second, and the digest stays small.
const tenth = (x: number) => Math.round(x * 10) / 10

async function digestResults(db: DbOrTx, pairs: { evaluationId: string; rowId: string }[]): Promise<Map<string, ResultDigest>> {
  const out = new Map<string, ResultDigest>()
  if (!pairs.length) return out
  const evaluationIds = [...new Set(pairs.map((p) => p.evaluationId))]
  const rowIds = [...new Set(pairs.map((p) => p.rowId))]
  const stored = await db.select().from(savingsResultDigests)
    .where(and(inArray(savingsResultDigests.evaluationId, evaluationIds), inArray(savingsResultDigests.rowId, rowIds)))
  for (const s of stored) out.set(`${s.evaluationId}|${s.rowId}`, JSON.parse(s.digest) as ResultDigest)
  const missing = pairs.filter((p) => !out.has(`${p.evaluationId}|${p.rowId}`))
  if (!missing.length) return out

  const results = await db.select({
    rowId: proposalResults.rowId, evaluationId: proposalResults.evaluationId, periodId: proposalResults.periodId, dayType: proposalResults.dayType,
    settings: proposalResults.settings, savingPerTripS: proposalResults.savingPerTripS, crossExtraDelayPerVehS: proposalResults.crossExtraDelayPerVehS,
    error: proposalResults.error,
    main: sql<number | null>`(${proposalResults.modelOutput} -> 'personDelay' ->> 'mainStreetOccupantsSavedS')::float8`,
    cross: sql<number | null>`(${proposalResults.modelOutput} -> 'personDelay' ->> 'crossStreetOccupantsLostS')::float8`,
    lockedOut: sql<number | null>`(${proposalResults.modelOutput} -> 'bus' -> 'priority' ->> 'lockedOutShare')::float8`,
    lateOnly: sql<boolean | null>`(${proposalResults.modelInput} -> 'priority' ->> 'lateOnly')::boolean`,
    lateShare: sql<number | null>`(${proposalResults.modelInput} -> 'priority' ->> 'lateShare')::float8`,
    baseline: sql<number[] | null>`jsonb_path_query_array(${proposalResults.modelOutput}, '$.delayByArrivalPhase[*].baselineS')`,
    priority: sql<number[] | null>`jsonb_path_query_array(${proposalResults.modelOutput}, '$.delayByArrivalPhase[*].priorityS')`,
  }).from(proposalResults)
    .where(and(
      inArray(proposalResults.evaluationId, [...new Set(missing.map((p) => p.evaluationId))]),
      inArray(proposalResults.rowId, [...new Set(missing.map((p) => p.rowId))]),
      eq(proposalResults.variant, 'proposed'),
    ))
  const built = new Map<string, ResultDigest>(missing.map((p) => [`${p.evaluationId}|${p.rowId}`, { settings: null, figures: {} }]))
  for (const x of results) {
    const d = built.get(`${x.evaluationId}|${x.rowId}`)
    if (!d) continue
    d.settings = x.settings
    const ok = !x.error && x.savingPerTripS !== null
    const base = x.baseline ?? []
    const prio = x.priority ?? []
    d.figures[resultKey(x.periodId, x.dayType)] = ok ? {
      savingPerTripS: x.savingPerTripS!, crossExtraDelayPerVehS: x.crossExtraDelayPerVehS ?? 0,
      mainSavedPersonSPerHour: x.main ?? 0, crossLostPersonSPerHour: x.cross ?? 0,
      phases: base.length === prio.length ? base.map((b, i) => ({ baselineS: tenth(b), priorityS: tenth(prio[i]) })) : [],
      // Buses that ask (all, or the late ones) and are not locked out get the priority run.
      priorityWeight: (x.lateOnly ? x.lateShare ?? 1 : 1) * (1 - (x.lockedOut ?? 0)),
    } : null
  }
  const values = [...built].map(([key, d]) => {
    const [evaluationId, rowId] = key.split('|')
    out.set(key, d)
    return { evaluationId, rowId, digest: JSON.stringify(d) }
  })
  for (let i = 0; i < values.length; i += 100) await db.insert(savingsResultDigests).values(values.slice(i, i + 100)).onConflictDoNothing()
  return out
}

export async function evaluatedRows(db: DbOrTx, proposalId: string): Promise<EvaluatedRows> {
  const rows = await db.select({
    r: proposalRows, name: intersections.name, cityName: organisations.name, distanceM: corridorApproaches.distanceM,
  }).from(proposalRows)
    .innerJoin(intersections, eq(proposalRows.intersectionId, intersections.id))
    .innerJoin(organisations, eq(intersections.jurisdictionId, organisations.id))
    .leftJoin(corridorApproaches, eq(proposalRows.approachId, corridorApproaches.id))
    .where(eq(proposalRows.proposalId, proposalId)).orderBy(asc(proposalRows.position))
  if (!rows.length) return { rows: [], evaluatedAt: null }
  const evaluations = await db.select().from(proposalEvaluations).where(eq(proposalEvaluations.proposalId, proposalId))
  const runOf = new Map(rows.map(({ r }) => [r.id, latestRuns(evaluations, r.id).proposed]))
  const digests = await digestResults(db, rows.flatMap(({ r }) => {
    const run = runOf.get(r.id)
    return run ? [{ evaluationId: run.id, rowId: r.id }] : []
  }))
  let evaluatedAt: Date | null = null
  for (const e of runOf.values()) if (e?.finishedAt && (!evaluatedAt || e.finishedAt > evaluatedAt)) evaluatedAt = e.finishedAt

  const out = rows.map(({ r, name, cityName, distanceM }): RowFigures => {
    const run = runOf.get(r.id)
    const d = run ? digests.get(`${run.id}|${r.id}`) : undefined
    return {
      rowId: r.id, position: r.position, intersectionId: r.intersectionId, intersectionName: name, jurisdictionName: cityName,
      status: r.status, approachId: r.approachId, distanceM: distanceM ?? null,
      stale: !!d?.settings && !sameSettings(d.settings, settingsOf(r)),
      results: d?.figures ?? {},
    }
  })
  return { rows: out, evaluatedAt: evaluatedAt?.toISOString() ?? null }
}

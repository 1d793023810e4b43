// The stored results of a proposal's rows as the savings use them: per row the figures of its
// current run (the newest that covered it), with the pieces of the model's output the
// aggregation needs: the person-delay terms and the delay-by-phase table.
import { and, asc, eq, inArray, sql } from 'drizzle-orm'
import type { DbOrTx } from '../signals/rows'
import { corridorApproaches, intersections, organisations, proposalEvaluations, proposalResults, proposalRows } from '../../db/schema'
import { latestRuns } from '../proposals/dto'
import { settingsOf } from '../proposals/records'
import { sameSettings } from '../../../shared/proposals/settings'
import { resultKey, type PeriodFigures, type RowFigures } from '../../../shared/savings/corridor-model'

export interface EvaluatedRows {
  rows: RowFigures[]
  /** When the newest run used finished; null when no row has figures. */
  evaluatedAt: string | null
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
  const runIds = [...new Set([...runOf.values()].filter((e) => e !== null).map((e) => e!.id))]
  const results = runIds.length
    ? await db.select({
      rowId: proposalResults.rowId, evaluationId: proposalResults.evaluationId, periodId: proposalResults.periodId, dayType: proposalResults.dayType,
      settings: proposalResults.settings, savingPerTripS: proposalResults.savingPerTripS, crossExtraDelayPerVehS: proposalResults.crossExtraDelayPerVehS,
      error: proposalResults.error,
      // Only these parts of the stored output: the rest of it is large and not needed here.
      main: sql<number | null>`(${proposalResults.modelOutput} -> 'personDelay' ->> 'mainStreetOccupantsSavedS')::float8`,
      cross: sql<number | null>`(${proposalResults.modelOutput} -> 'personDelay' ->> 'crossStreetOccupantsLostS')::float8`,
      lockedOut: sql<number | null>`(${proposalResults.modelOutput} -> 'bus' -> 'priority' ->> 'lockedOutShare')::float8`,
      lateOnly: sql<boolean | null>`(${proposalResults.modelInput} -> 'priority' ->> 'lateOnly')::boolean`,
      lateShare: sql<number | null>`(${proposalResults.modelInput} -> 'priority' ->> 'lateShare')::float8`,
      phases: sql<{ baselineS: number; priorityS: number }[] | null>`${proposalResults.modelOutput} -> 'delayByArrivalPhase'`,
    }).from(proposalResults)
      .where(and(inArray(proposalResults.evaluationId, runIds), eq(proposalResults.variant, 'proposed')))
    : []
  let evaluatedAt: Date | null = null
  for (const e of runOf.values()) if (e?.finishedAt && (!evaluatedAt || e.finishedAt > evaluatedAt)) evaluatedAt = e.finishedAt

  const out = rows.map(({ r, name, cityName, distanceM }): RowFigures => {
    const run = runOf.get(r.id)
    const mine = run ? results.filter((x) => x.rowId === r.id && x.evaluationId === run.id) : []
    const figures: Record<string, PeriodFigures | null> = {}
    for (const x of mine) {
      const ok = !x.error && x.savingPerTripS !== null
      const weight = (x.lateOnly ? x.lateShare ?? 1 : 1) * (1 - (x.lockedOut ?? 0))
      figures[resultKey(x.periodId, x.dayType)] = ok ? {
        savingPerTripS: x.savingPerTripS!, crossExtraDelayPerVehS: x.crossExtraDelayPerVehS ?? 0,
        mainSavedPersonSPerHour: x.main ?? 0, crossLostPersonSPerHour: x.cross ?? 0,
        phases: x.phases ?? [], priorityWeight: weight,
      } : null
    }
    return {
      rowId: r.id, position: r.position, intersectionId: r.intersectionId, intersectionName: name, jurisdictionName: cityName,
      status: r.status, approachId: r.approachId, distanceM: distanceM ?? null,
      stale: mine.length > 0 && !sameSettings(mine[0].settings, settingsOf(r)),
      results: figures,
    }
  })
  return { rows: out, evaluatedAt: evaluatedAt?.toISOString() ?? null }
}

// Everything an evaluation reads, loaded once: the corridor's schedule, periods and approaches,
// the intersections and their timing plans. computeRowResults turns one row into its stored
// results (one per period and day type) from this context alone, without touching the database.
import { asc, eq, inArray } from 'drizzle-orm'
import { approachVolumes, corridorApproaches, corridorPeriods, intersections, timingPlans } from '../../db/schema'
import { corridorRow, stopsOf } from '../corridors/rows'
import { corridorSchedule, type CorridorSchedule } from '../corridors/corridor-runs'
import { feedRow } from '../corridors/gtfs-queries'
import { approachBody, type ApproachInput, type ApproachResult } from '../../../shared/schemas/model'
import { checkApproach, evaluateApproach } from '../../../shared/model'
import { minuteOfDay, timeAtDistance } from '../../../shared/corridors/schedule'
import { DAY_TYPES, DAY_TYPE_LABELS, inWindow, overlapMinutes, windowMinutes, type DayType } from '../../../shared/signals/time-of-day'
import type { RowSettings } from '../../../shared/schemas/proposals'
import { rowModelInput } from '../../../shared/proposals/model-input'
import type { proposalResults } from '../../db/schema'
import type { DbOrTx } from './records'

type TimingPlanRow = typeof timingPlans.$inferSelect
type ApproachRow = typeof corridorApproaches.$inferSelect
export type ResultInsert = typeof proposalResults.$inferInsert

export interface EvaluationContext {
  feedVersionId: number
  periods: { id: string; name: string; startTime: string; endTime: string; minutes: number }[]
  stopDistancesM: number[]
  stopDistanceById: Map<string, number>
  schedule: CorridorSchedule
  approaches: Map<string, ApproachRow>
  volumes: Map<string, { volumeVehPerHour: number; crossVolumeVehPerHour: number }>
  intersectionVersions: Map<string, number>
  plans: Map<string, TimingPlanRow[]>
  /** Memo of model runs by input: day types often share the plan and the bus count. */
  memo: Map<string, ApproachResult | string>
}

export async function loadEvaluationContext(db: DbOrTx, corridorId: string): Promise<EvaluationContext> {
  const corridor = await corridorRow(db, corridorId)
  const stops = await stopsOf(db, corridorId)
  const feed = await feedRow(db, corridor.feedVersionId)
  const schedule = await corridorSchedule(db, corridor, stops, { serviceStart: feed?.serviceStart ?? null, serviceEnd: feed?.serviceEnd ?? null })
  const periods = await db.select().from(corridorPeriods).where(eq(corridorPeriods.corridorId, corridorId)).orderBy(asc(corridorPeriods.sortOrder))
  const approaches = await db.select().from(corridorApproaches).where(eq(corridorApproaches.corridorId, corridorId))
  const ids = approaches.map((a) => a.id)
  const volumes = ids.length ? await db.select().from(approachVolumes).where(inArray(approachVolumes.approachId, ids)) : []
  const intersectionIds = [...new Set(approaches.map((a) => a.intersectionId))]
  const [xs, plans] = intersectionIds.length
    ? await Promise.all([
      db.select({ id: intersections.id, version: intersections.version }).from(intersections).where(inArray(intersections.id, intersectionIds)),
      db.select().from(timingPlans).where(inArray(timingPlans.intersectionId, intersectionIds)),
    ])
    : [[], []]
  const plansBy = new Map<string, TimingPlanRow[]>()
  for (const p of plans) plansBy.set(p.intersectionId, [...(plansBy.get(p.intersectionId) ?? []), p])
  return {
    feedVersionId: corridor.feedVersionId,
    periods: periods.map((p) => ({ id: p.id, name: p.name, startTime: p.startTime, endTime: p.endTime, minutes: windowMinutes(p) })),
    stopDistancesM: stops.map((s) => s.distanceM),
    stopDistanceById: new Map(stops.map((s) => [s.stopId, s.distanceM])),
    schedule,
    approaches: new Map(approaches.map((a) => [a.id, a])),
    volumes: new Map(volumes.map((v) => [`${v.approachId}|${v.periodId}`, v])),
    intersectionVersions: new Map(xs.map((x) => [x.id, x.version])),
    plans: plansBy,
    memo: new Map(),
  }
}

/**
 * Average buses crossing the stop line in each period on each day type: every run of the corridor
 * passes the approach's distance at a time interpolated between its stops, and counts by how often
 * its service runs on that day type.
 */
export function tripsAtApproach(ctx: EvaluationContext, distanceM: number): Map<string, Record<DayType, number>> {
  const out = new Map(ctx.periods.map((p) => [p.id, { weekday: 0, saturday: 0, sunday: 0 } as Record<DayType, number>]))
  for (const run of ctx.schedule.runs) {
    const t = timeAtDistance(run, ctx.stopDistancesM, distanceM)
    if (t === null) continue
    const m = minuteOfDay(t)
    const period = ctx.periods.find((p) => inWindow(p, m))
    if (!period) continue
    const share = ctx.schedule.share(run.serviceId)
    const acc = out.get(period.id)!
    for (const d of DAY_TYPES) acc[d] += share[d]
  }
  return out
}

/** The plan in force for most of the period on that day type. */
export function planForPeriod(plans: readonly TimingPlanRow[], period: { startTime: string; endTime: string }, dayType: DayType): TimingPlanRow | null {
  let best: TimingPlanRow | null = null
  let bestMinutes = 0
  for (const p of plans) {
    if (!p.dayTypes.includes(dayType)) continue
    const m = overlapMinutes(p, period)
    if (m > bestMinutes) { best = p; bestMinutes = m }
  }
  return best
}

function runModel(ctx: EvaluationContext, input: ApproachInput): ApproachResult | string {
  const key = JSON.stringify(input)
  const hit = ctx.memo.get(key)
  if (hit !== undefined) return hit
  let out: ApproachResult | string
  const violations = checkApproach(input)
  if (violations.length) {
    out = violations.map((v) => `${v.field}: ${v.reason}`).join('; ')
  } else {
    try {
      out = evaluateApproach(input)
    } catch (err) {
      out = `The model could not evaluate this case: ${err instanceof Error ? err.message : String(err)}`
    }
  }
  ctx.memo.set(key, out)
  return out
}

export interface RowToEvaluate {
  id: string
  version: number
  approachId: string | null
  intersectionId: string
}

type ModelInputArgs = Parameters<typeof rowModelInput>[0]

/**
 * The model body of one approach in one period, as every evaluation builds it (stored results,
 * counters and the recommender all use this one).
 */
export function periodModelBody(
  ctx: EvaluationContext, approach: ApproachRow, period: EvaluationContext['periods'][number],
  a: { plan: ModelInputArgs['plan']; volumes: ModelInputArgs['volumes']; settings: RowSettings; tripsPerDay: number },
) {
  const stopDistance = approach.stopId ? ctx.stopDistanceById.get(approach.stopId) : undefined
  return rowModelInput({
    approach: {
      lanes: approach.lanes, saturationFlowVehPerHourPerLane: approach.saturationFlowVehPerHourPerLane, speedLimitKmh: approach.speedLimitKmh,
      jamDensityVehPerKmPerLane: approach.jamDensityVehPerKmPerLane, crossLanes: approach.crossLanes,
      crossSaturationFlowVehPerHourPerLane: approach.crossSaturationFlowVehPerHourPerLane, stopRelation: approach.stopRelation,
      stopDistanceM: stopDistance === undefined ? null : Math.abs(approach.distanceM - stopDistance),
      dwellS: approach.dwellS, checkInDistanceM: approach.checkInDistanceM,
    },
    volumes: a.volumes,
    plan: a.plan,
    settings: a.settings,
    busesPerHour: period.minutes ? Math.min(200, a.tripsPerDay / (period.minutes / 60)) : 0,
  })
}

export function computeRowResults(
  ctx: EvaluationContext, row: RowToEvaluate, settings: RowSettings,
  run: { evaluationId: string; proposalId: string; proposalVersion: number; variant: 'proposed' | 'counter' },
): ResultInsert[] {
  const approach = row.approachId ? ctx.approaches.get(row.approachId) : undefined
  const plans = ctx.plans.get(row.intersectionId) ?? []
  const trips = approach ? tripsAtApproach(ctx, approach.distanceM) : null
  const out: ResultInsert[] = []
  for (const period of ctx.periods) {
    for (const dayType of DAY_TYPES) {
      const tripsPerDay = trips?.get(period.id)?.[dayType] ?? 0
      const plan = planForPeriod(plans, period, dayType)
      const base: ResultInsert = {
        evaluationId: run.evaluationId, proposalId: run.proposalId, rowId: row.id, rowVersion: row.version, proposalVersion: run.proposalVersion,
        variant: run.variant, settings, periodId: period.id, periodName: period.name, startTime: period.startTime, endTime: period.endTime,
        dayType, tripsPerDay, timingPlanId: plan?.id ?? null, timingPlanName: plan?.name ?? null, timingPlanVersion: plan?.version ?? null,
        approachVersion: approach?.version ?? null, intersectionVersion: ctx.intersectionVersions.get(row.intersectionId) ?? null,
        cycleS: plan?.cycleS ?? null,
      }
      const volumes = approach ? ctx.volumes.get(`${approach.id}|${period.id}`) : undefined
      const missing = !approach ? 'The approach was removed from the corridor.'
        : !plan ? `No timing plan covers ${period.name} on ${DAY_TYPE_LABELS[dayType]}s.`
          : !volumes ? `No traffic volumes for ${period.name} at this approach.` : null
      if (missing) { out.push({ ...base, error: missing }); continue }
      const body = periodModelBody(ctx, approach!, period, { plan: plan!, volumes: volumes!, settings, tripsPerDay })
      const parsed = approachBody.safeParse(body)
      if (!parsed.success) {
        out.push({ ...base, error: `The stored data do not make a valid model input: ${parsed.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`).join('; ')}` })
        continue
      }
      const result = runModel(ctx, parsed.data)
      if (typeof result === 'string') { out.push({ ...base, error: result, modelInput: parsed.data }); continue }
      const hours = period.minutes / 60
      out.push({
        ...base,
        busDelayBaselineS: result.bus.baseline.meanDelayS,
        busDelayPriorityS: result.bus.priority.meanDelayS,
        savingPerTripS: result.bus.meanSavingS,
        dailyBusHoursSaved: (result.bus.meanSavingS * tripsPerDay) / 3600,
        grantShare: result.bus.priority.grantShare,
        crossExtraDelayPerVehS: result.crossStreet.extraDelayPerVehS,
        vcBefore: result.crossStreet.vcBefore,
        vcAfter: result.crossStreet.vcAfter,
        losBefore: result.crossStreet.losBefore,
        losAfter: result.crossStreet.losAfter,
        // The model gives person-seconds per hour at the period's bus rate.
        personDelayBalanceS: result.personDelayBalanceS * hours,
        error: null,
        modelInput: parsed.data,
        modelOutput: result,
      })
    }
  }
  return out
}

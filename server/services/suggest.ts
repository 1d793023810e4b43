// Suggested settings for the rows of a proposal (POST /api/proposals/:id/suggest): for each row,
// the recommender over the periods of one day type, each period with its own timing plan and
// volumes, within the limits of the row's city and of every timing plan of the intersection. The
// row is then edited through the proposals service (version-checked, recorded in its history) and
// stays a draft until it is submitted and the city decides.
import { asc, eq, inArray } from 'drizzle-orm'
import type { User } from 'lucia'
import type { Db } from '../db'
import { intersections, proposalRows } from '../db/schema'
import { Conflict, HttpError } from '../errors'
import { checkApproach } from '../../shared/model'
import { sweepApproach, sweepGrid, withSettings } from '../../shared/model/sweep'
import { recommend, recommendOptions, type SweepCase } from '../../shared/model/recommend'
import { approachBody, type ApproachInput } from '../../shared/schemas/model'
import type { CityLimits, ConstraintKind } from '../../shared/schemas/city-limits'
import { SWEEP_CAUTION, sweepRanges, type SuggestResponse, type SuggestRowResult, type SweepPoint, type SweepSettings } from '../../shared/schemas/sweep'
import type { DayType } from '../../shared/signals/time-of-day'
import { DAY_TYPE_LABELS } from '../../shared/signals/time-of-day'
import type { RowSettings } from '../../shared/schemas/proposals'
import { checkPriority, type PlanForCheck } from '../../shared/proposals/priority-checks'
import { SOURCES } from '../../shared/signals/limits'
import { transition } from '../../shared/proposals/row-state'
import { rowSettingsWith } from '../../shared/proposals/sweep-settings'
import { loadEvaluationContext, periodModelBody, planForPeriod, tripsAtApproach, type EvaluationContext } from './proposals/evaluation-context'
import { assertMayPlan, proposalRecord, rowRecord, settingsOf, type RowRecord } from './proposals/records'
import { rowDtos } from './proposals/dto'
import { patchRow } from './proposals/rows'
import { limitsForCity } from './city-limits'
import { NO_PRIORITY } from './sweep'

/** The grid the suggestions search: limits 0-20 s in 1 s, lockout 0-3, every bus or late ones. */
const SUGGEST_RANGES = sweepRanges.parse({})

interface PeriodInput {
  label: string
  input: ApproachInput
  hours: number
  trips: number
}

/** The row's model input in each period of the day type, as the evaluation builds it. */
function periodInputs(ctx: EvaluationContext, row: RowRecord, dayType: DayType): { inputs: PeriodInput[]; skipped: string[] } {
  const approach = row.approachId ? ctx.approaches.get(row.approachId) : undefined
  if (!approach) return { inputs: [], skipped: ['The approach was removed from the corridor.'] }
  const plans = ctx.plans.get(row.intersectionId) ?? []
  const trips = tripsAtApproach(ctx, approach.distanceM)
  const inputs: PeriodInput[] = []
  const skipped: string[] = []
  for (const period of ctx.periods) {
    const plan = planForPeriod(plans, period, dayType)
    const volumes = ctx.volumes.get(`${approach.id}|${period.id}`)
    if (!plan) { skipped.push(`No timing plan covers ${period.name} on ${DAY_TYPE_LABELS[dayType]}s.`); continue }
    if (!volumes) { skipped.push(`No traffic volumes for ${period.name}.`); continue }
    const tripsPerDay = trips.get(period.id)?.[dayType] ?? 0
    const parsed = approachBody.safeParse(periodModelBody(ctx, approach, period, { plan, volumes, settings: settingsOf(row), tripsPerDay }))
    if (!parsed.success) { skipped.push(`${period.name}: the stored data do not make a valid model input.`); continue }
    const broken = checkApproach(withSettings(parsed.data, NO_PRIORITY))
    if (broken.length) { skipped.push(`${period.name}: ${broken.map((v) => v.reason).join('; ')}.`); continue }
    inputs.push({ label: period.name, input: parsed.data, hours: period.minutes / 60, trips: tripsPerDay })
  }
  return { inputs, skipped }
}

/**
 * The row's own checks against every timing plan of the intersection (plans of other day types
 * too), which an edit must pass: a setting that fails one is marked as breaking that floor.
 */
function planChecks(grid: readonly SweepSettings[], plans: readonly PlanForCheck[], row: RowSettings): SweepPoint['violations'][] {
  return grid.map((s) => checkPriority(rowSettingsWith(s, row), plans).filter((c) => c.severity === 'error').map((c) => ({
    constraint: (c.source === SOURCES.pedestrian ? 'ped-walk-clearance' : 'min-green') as ConstraintKind,
    detail: c.message,
  })))
}

function suggestRow(ctx: EvaluationContext, row: RowRecord, limits: CityLimits, body: { objective: 'person-delay' | 'bus-saving'; dayType: DayType }) {
  const { inputs, skipped } = periodInputs(ctx, row, body.dayType)
  if (!inputs.length) return { recommendation: null, skipped: skipped.join(' ') || `No period on ${DAY_TYPE_LABELS[body.dayType]}s to suggest for.` }
  const grid = sweepGrid(SUGGEST_RANGES)
  const extra = planChecks(grid, ctx.plans.get(row.intersectionId) ?? [], settingsOf(row))
  const cases: SweepCase[] = inputs.map((c) => {
    const sweep = sweepApproach(c.input, SUGGEST_RANGES, limits)
    const points = sweep.points.map((pt, i) => (extra[i].length ? { ...pt, violations: [...pt.violations, ...extra[i]] } : pt))
    return { label: c.label, points, personWeight: c.hours, busWeight: c.trips, availableGreenS: sweep.baseline.availableGreenS }
  })
  return { recommendation: recommend(cases, recommendOptions(SUGGEST_RANGES, limits, body.objective)), skipped: null }
}

export async function suggestSettings(
  db: Db, actor: User, proposalId: string,
  body: { rowId?: string; version?: number; objective: 'person-delay' | 'bus-saving'; dayType: DayType },
): Promise<SuggestResponse> {
  const p = await proposalRecord(db, proposalId)
  assertMayPlan(actor, p)
  const rows = body.rowId
    ? [await rowRecord(db, proposalId, body.rowId)]
    : await db.select().from(proposalRows).where(eq(proposalRows.proposalId, proposalId)).orderBy(asc(proposalRows.position))
  if (body.rowId) {
    // refuse a stale or closed row before the work, with the row as it is now
    const row = rows[0]
    const t = transition(row.status, { type: 'edit' })
    if (row.version !== body.version || !t.ok) {
      const [dto] = await rowDtos(db, actor, p, [row.id])
      throw new Conflict(!t.ok ? t.reason : 'Someone changed this row since you opened it. Here is the row as it is now.', { row: dto })
    }
  }
  const xs = rows.length
    ? await db.select({ id: intersections.id, name: intersections.name, cityId: intersections.jurisdictionId }).from(intersections)
      .where(inArray(intersections.id, [...new Set(rows.map((r) => r.intersectionId))]))
    : []
  const byId = new Map(xs.map((x) => [x.id, x]))
  const limitsByCity = new Map<string, CityLimits>()
  for (const cityId of new Set(xs.map((x) => x.cityId))) limitsByCity.set(cityId, await limitsForCity(db, cityId))
  const ctx = await loadEvaluationContext(db, p.corridorId)

  const out: SuggestRowResult[] = []
  for (const row of rows) {
    const x = byId.get(row.intersectionId)!
    const base: SuggestRowResult = { rowId: row.id, intersectionName: x.name, version: null, applied: false, skipped: null, recommendation: null }
    const t = transition(row.status, { type: 'edit' })
    if (!t.ok) { out.push({ ...base, skipped: t.reason }); continue }
    const { recommendation, skipped } = suggestRow(ctx, row, limitsByCity.get(x.cityId)!, body)
    if (!recommendation) { out.push({ ...base, skipped }); continue }
    if (!recommendation.feasible) { out.push({ ...base, recommendation, skipped: recommendation.summary }); continue }
    const next = rowSettingsWith(recommendation.settings, settingsOf(row))
    try {
      const dto = await patchRow(db, actor, proposalId, row.id, {
        version: row.version, strategy: next.strategy, maxExtensionS: next.maxExtensionS, maxEarlyGreenS: next.maxEarlyGreenS,
        lockoutCycles: next.lockoutCycles, conditional: { onlyLateBuses: next.conditional.onlyLateBuses },
      })
      out.push({ ...base, version: dto.version, applied: true, recommendation })
    } catch (err) {
      // one row: the caller sees the service's own answer; all rows: the others go on
      if (body.rowId || !(err instanceof HttpError) || (err.status !== 409 && err.status !== 422)) throw err
      out.push({ ...base, recommendation, skipped: err.status === 409 ? 'The row changed while the suggestions were worked out; open it again.' : err.message })
    }
  }
  return { rows: out, caution: SWEEP_CAUTION }
}

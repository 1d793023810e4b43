// Everything the dashboard and the proposal report show for one corridor and one proposal,
// from the schedule digest, the stored results of the rows, the agency's inputs and a
// reference date. Pure: the server loads, this computes.
import { isoDate } from '../gtfs/date'
import { DAY_TYPES } from '../signals/time-of-day'
import { ROW_STATUSES, type RowStatus } from '../schemas/proposals'
import type { CorridorSavingsDto, SavingsInputsDto, StatusSharesDto } from '../schemas/savings'
import { buildCorridorModel, type RowFigures } from './corridor-model'
import type { ScheduleDigest } from './schedule-digest'
import { annualFigures, dayFigures, hourlyFigures, intersectionFigures, periodFigures, personDelay } from './figures'
import { reliabilityFigures } from './reliability'
import { fleetFigures } from './route-fleet'

export interface CorridorSavingsSource {
  corridor: CorridorSavingsDto['corridor']
  proposal: CorridorSavingsDto['proposal']
  schedule: CorridorSavingsDto['schedule']
  inputs: SavingsInputsDto
  digest: ScheduleDigest
  rows: readonly RowFigures[]
  routeNames?: ReadonlyMap<string, string>
  /** Day number the 12 months start on. */
  referenceDay: number
  /** Bin of the delay distributions, s (default 2). */
  binS?: number
}

export function statusShares(statuses: readonly RowStatus[]): StatusSharesDto {
  const counts = Object.fromEntries(ROW_STATUSES.map((s) => [s, 0])) as Record<RowStatus, number>
  for (const s of statuses) counts[s]++
  const n = statuses.length
  const share = (k: number) => (n ? k / n : 0)
  return {
    counts, rows: n,
    accepted: share(counts.accepted),
    pending: share(counts.draft + counts.submitted + counts['change-requested']),
    refused: share(counts.rejected),
  }
}

export function corridorSavings(src: CorridorSavingsSource): CorridorSavingsDto {
  const m = buildCorridorModel(src.digest, src.rows, src.inputs, src.referenceDay)
  const balance = personDelay(m)
  const { trips, ...annual } = annualFigures(m, balance)
  const warnings: string[] = []
  if (!src.proposal) warnings.push('No proposal on this corridor yet: every saving is zero.')
  else if (!src.proposal.evaluatedAt) warnings.push('The proposal has not been evaluated yet: every saving is zero.')
  const stale = src.rows.filter((r) => r.stale).length
  if (stale) warnings.push(`${stale} row${stale > 1 ? 's have' : ' has'} settings changed since the evaluation: evaluate the proposal again.`)
  const unplaced = src.rows.filter((r) => r.approachId === null || !src.digest.approachIds.includes(r.approachId)).length
  if (unplaced) warnings.push(`${unplaced} row${unplaced > 1 ? 's are' : ' is'} no longer on the corridor and count${unplaced > 1 ? '' : 's'} for nothing.`)
  if (!m.runs.length) warnings.push('No trip of the schedule runs the corridor.')
  const fed = src.digest.feedId !== src.corridor.feedId
  return {
    corridor: src.corridor,
    proposal: src.proposal,
    schedule: src.schedule,
    inputs: src.inputs,
    annualisation: {
      basis: m.year.basis, from: isoDate(m.year.window.fromDay), to: isoDate(m.year.window.toDay),
      feedStart: m.year.feedRange ? isoDate(m.year.feedRange.startDay) : null,
      feedEnd: m.year.feedRange ? isoDate(m.year.feedRange.endDay) : null,
      daysOfType: m.year.daysOfType, scale: m.year.scale, trips, note: m.year.note,
    },
    status: statusShares(src.rows.map((r) => r.status)),
    days: dayFigures(m),
    annual,
    personDelay: balance,
    intersections: intersectionFigures(m),
    periods: periodFigures(m),
    hourly: hourlyFigures(m),
    reliability: reliabilityFigures(m, { binS: src.binS }),
    fleet: fleetFigures(m, src.routeNames),
    assumptions: assumptions(src, fed),
    warnings,
  }
}

function assumptions(src: CorridorSavingsSource, otherFeed: boolean): string[] {
  const i = src.inputs
  const source = { corridor: 'entered for this corridor', agency: 'the agency’s defaults', default: 'Fanlight’s defaults, not the agency’s figures' }[i.source]
  return [
    'Savings per trip add the model’s expected saving at each intersection in the period the bus crosses it; the crossing time is interpolated along the shape between the stop times either side.',
    'Agreed figures count only the rows the cities accepted, with their accepted settings; the proposed figures count every row as proposed.',
    `Inputs are ${source}: average load ${i.defaultLoad} passengers${i.loads.length ? ` (${i.loads.length} route or period value${i.loads.length > 1 ? 's' : ''} besides)` : ''}, `
      + `layover ${Math.round(i.layoverShare * 100)}% of the round trip, `
      + (i.costPerRevenueHour === null ? 'no operating cost given.' : `${i.costPerRevenueHour} ${i.currency} per revenue-hour (${i.costYear} prices).`),
    'Passenger-hours are bus riders’ time: saving per trip times the average load of the route in the period.',
    'The person-delay balance adds riders’ time saved and car occupants’ time on the bus street, less the time the cross streets lose, at the occupancy the model assumed.',
    'Run-time percentiles treat the arrival at each signal as independent of the last (no progression) and bus delays over uniform arrival phases, to the nearest 2 s; coordinated signals spread less.',
    'Peak vehicles per route: ceil(cycle time / headway), the cycle being the round trip plus layover, rounded up to the minute (common practice). Priority shortens only the corridor’s direction.',
    'Operating cost and fleet savings become real only when the scheduled running times are cut to match.',
    `Day types: ${DAY_TYPES.join(', ')}; an average day counts each trip by how often its service runs on such days in the feed’s range.`,
    ...(otherFeed ? ['The per-intersection savings were computed on the corridor’s own feed and are applied here to another feed’s schedule.'] : []),
  ]
}

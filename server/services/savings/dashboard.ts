// The manager's dashboard and the proposal report: for a corridor, the proposal in force (the
// newest submitted, else the newest draft) aggregated over a schedule; without a corridor,
// every corridor side by side. The figures themselves are worked out in shared/savings.
import { asc, desc, eq } from 'drizzle-orm'
import type { User } from 'lucia'
import type { DbOrTx } from '../signals/rows'
import { corridors, feedVersions, intersections, proposalRows, proposals } from '../../db/schema'
import { NotFound, Unprocessable } from '../../errors'
import { corridorRow, type CorridorRow } from '../corridors/rows'
import { routesOf } from '../corridors/gtfs-queries'
import { mayView, proposalRecord } from '../proposals/records'
import { effectiveInputs } from './inputs'
import { corridorDigest } from './digest'
import { evaluatedRows } from './results'
import { corridorSavings } from '../../../shared/savings/corridor-savings'
import { dayOfIso } from '../../../shared/gtfs/date'
import type { CorridorComparisonDto, CorridorSavingsDto, DashboardDto, DashboardQuery, ProposalReportDto } from '../../../shared/schemas/savings'

type ProposalRow = typeof proposals.$inferSelect

export interface SavingsOptions {
  /** The feed whose schedule is aggregated; the corridor's own when absent. */
  feedId?: number
  /** "YYYY-MM-DD" the 12 months start on. */
  from: string
  binS?: number
}

const isoToday = (now: Date) => now.toISOString().slice(0, 10)

async function feedFor(db: DbOrTx, corridor: CorridorRow, feedId: number | undefined) {
  const [feed] = await db.select().from(feedVersions).where(eq(feedVersions.id, feedId ?? corridor.feedVersionId))
  if (!feed) {
    if (feedId === undefined) throw new NotFound('Feed version of the corridor')
    throw new Unprocessable('No such feed version.', [{ path: ['feedId'], message: `Feed version ${feedId} does not exist.` }])
  }
  if (feed.state !== 'ready') throw new Unprocessable('This feed version has not been imported.', [{ path: ['feedId'], message: `Feed version ${feed.id} is ${feed.state}.` }])
  if (feed.organisationId !== corridor.agencyId) {
    throw new Unprocessable('The feed belongs to another agency.', [{ path: ['feedId'], message: 'Use a feed of the agency that owns the corridor.' }])
  }
  return feed
}

/** The newest submitted proposal of the corridor, else its newest draft. */
async function proposalInForce(db: DbOrTx, corridorId: string): Promise<ProposalRow | null> {
  const list = await db.select().from(proposals).where(eq(proposals.corridorId, corridorId)).orderBy(desc(proposals.createdAt), asc(proposals.id))
  const submitted = list.filter((p) => p.status === 'submitted').sort((a, b) => (b.submittedAt?.getTime() ?? 0) - (a.submittedAt?.getTime() ?? 0))
  return submitted[0] ?? list[0] ?? null
}

export async function corridorFigures(db: DbOrTx, actor: User, corridor: CorridorRow, proposal: ProposalRow | null, o: SavingsOptions): Promise<CorridorSavingsDto> {
  const feed = await feedFor(db, corridor, o.feedId)
  const year = Number(o.from.slice(0, 4))
  const [inputs, digest, evaluated, routes] = await Promise.all([
    effectiveInputs(db, actor, corridor.agencyId, corridor.id, year),
    corridorDigest(db, corridor, feed),
    proposal ? evaluatedRows(db, proposal.id) : Promise.resolve({ rows: [], evaluatedAt: null }),
    routesOf(db, feed.id, corridor.routeIds),
  ])
  return corridorSavings({
    corridor: { id: corridor.id, name: corridor.name, lengthM: corridor.lengthM, routeIds: corridor.routeIds, feedId: corridor.feedVersionId },
    proposal: proposal ? { id: proposal.id, name: proposal.name, status: proposal.status, version: proposal.version, evaluatedAt: evaluated.evaluatedAt } : null,
    schedule: { feedId: feed.id, feedName: feed.name },
    inputs, digest, rows: evaluated.rows, referenceDay: dayOfIso(o.from), binS: o.binS,
    routeNames: new Map(routes.map((r) => [r.routeId, r.shortName ?? r.longName ?? r.routeId])),
  })
}

function comparison(f: CorridorSavingsDto): CorridorComparisonDto {
  const weekday = f.days.find((d) => d.dayType === 'weekday')!
  const fleet = f.fleet.find((x) => x.dayType === 'weekday')!
  return {
    corridorId: f.corridor.id, corridorName: f.corridor.name, feedId: f.schedule.feedId, proposalName: f.proposal?.name ?? null,
    intersections: f.status.rows, weekdayTrips: weekday.trips,
    acceptedSavingPerTripS: weekday.accepted.savingPerTripS, proposedSavingPerTripS: weekday.proposed.savingPerTripS,
    acceptedShareOfRunTime: weekday.accepted.shareOfRunTime,
    acceptedVehicleHoursPerYear: f.annual.accepted.vehicleHours, proposedVehicleHoursPerYear: f.annual.proposed.vehicleHours,
    acceptedCostPerYear: f.annual.accepted.cost, currency: f.inputs.currency,
    acceptedPassengerHoursPerYear: f.annual.accepted.passengerHours,
    peakBuses: fleet.peak, status: f.status,
  }
}

export async function dashboard(db: DbOrTx, actor: User, query: DashboardQuery, now: Date): Promise<DashboardDto> {
  const o: SavingsOptions = { feedId: query.feedId, from: query.from ?? isoToday(now) }
  if (query.corridorId) {
    const corridor = await corridorRow(db, query.corridorId)
    return { corridor: await corridorFigures(db, actor, corridor, await proposalInForce(db, corridor.id), o), corridors: [] }
  }
  if (query.feedId !== undefined) {
    const [feed] = await db.select({ id: feedVersions.id }).from(feedVersions).where(eq(feedVersions.id, query.feedId))
    if (!feed) throw new Unprocessable('No such feed version.', [{ path: ['feedId'], message: `Feed version ${query.feedId} does not exist.` }])
  }
  const list = await db.select().from(corridors)
    .where(query.feedId !== undefined ? eq(corridors.feedVersionId, query.feedId) : undefined).orderBy(asc(corridors.name), asc(corridors.id))
  const out: CorridorComparisonDto[] = []
  // Each corridor on its own feed: side by side means each as it is scheduled.
  for (const c of list) out.push(comparison(await corridorFigures(db, actor, c, await proposalInForce(db, c.id), { from: o.from })))
  return { corridor: null, corridors: out }
}

/** One proposal's figures, whatever its status; engineers see only submitted proposals touching their city. */
export async function proposalReport(db: DbOrTx, actor: User, proposalId: string, from: string | undefined, now: Date): Promise<ProposalReportDto> {
  const p = await proposalRecord(db, proposalId)
  const cities = await db.selectDistinct({ id: intersections.jurisdictionId }).from(proposalRows)
    .innerJoin(intersections, eq(proposalRows.intersectionId, intersections.id)).where(eq(proposalRows.proposalId, p.id))
  if (!mayView(actor, p, cities.map((c) => c.id))) throw new NotFound('Proposal')
  const corridor = await corridorRow(db, p.corridorId)
  return { generatedAt: now.toISOString(), figures: await corridorFigures(db, actor, corridor, p, { from: from ?? isoToday(now) }) }
}

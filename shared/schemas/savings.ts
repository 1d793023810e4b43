// Request bodies and response shapes of /api/dashboard (corridor savings, their inputs) and
// /api/proposals/:id/report. Figures are SI (seconds, metres) and hours; the client converts units.
import { z } from 'zod'
import { parseGtfsDate } from '../gtfs/date'
import type { DayType } from '../signals/time-of-day'
import type { RowStatus } from './proposals'

const isoDate = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, { message: 'Use YYYY-MM-DD.', abort: true })
  .refine((s) => parseGtfsDate(s.replaceAll('-', '')) !== null, 'Not a real date.')

export const dashboardQuery = z.strictObject({
  corridorId: z.string().min(1).max(100).optional(),
  /** The schedule to aggregate with: the corridor's own feed version when absent. */
  feedId: z.coerce.number().int().positive().optional(),
  /** Start of the 12 months the annual figures cover: today when absent. */
  from: isoDate.optional(),
})
export type DashboardQuery = z.infer<typeof dashboardQuery>

export const reportQuery = z.strictObject({ from: isoDate.optional() })
export const reportParams = z.object({ id: z.string().min(1).max(100) })

export const inputsQuery = z.strictObject({ corridorId: z.string().min(1).max(100).optional() })

export const CURRENCY_PATTERN = /^[A-Z]{3}$/

/** Average passengers on board a bus of a route in a period; '*' rows apply to every route or period. */
export const loadBody = z.strictObject({
  routeId: z.string().min(1).max(255).nullable(),
  periodName: z.string().trim().min(1).max(40).nullable(),
  passengers: z.number().min(0).max(300),
})
export type LoadInput = z.infer<typeof loadBody>

export const savingsInputsFields = {
  /** Passengers on board when no row of `loads` matches. */
  defaultLoad: z.number().min(0).max(300),
  loads: z.array(loadBody).max(200),
  /** Operating cost of one revenue-hour of bus service; null until the agency gives it. */
  costPerRevenueHour: z.number().positive().max(100_000).nullable(),
  currency: z.string().regex(CURRENCY_PATTERN, 'Use a three-letter ISO 4217 code, e.g. EUR or USD.'),
  /** The year the cost is expressed in (costs change yearly). */
  costYear: z.number().int().min(1990).max(2100),
  /** Layover and recovery time as a share of the round trip. */
  layoverShare: z.number().min(0).max(1),
}

export const savingsInputsBody = z.strictObject({
  /** The corridor the inputs are for; absent: the agency's defaults for all its corridors. */
  corridorId: z.string().min(1).max(100).nullable().default(null),
  ...savingsInputsFields,
  /** The version read (absent when creating). */
  version: z.number().int().positive().optional(),
}).superRefine((b, ctx) => {
  const seen = new Set<string>()
  b.loads.forEach((l, i) => {
    const key = `${l.routeId ?? '*'}|${l.periodName ?? '*'}`
    if (seen.has(key)) ctx.addIssue({ code: 'custom', path: ['loads', i], message: 'This route and period already have a load.' })
    seen.add(key)
  })
})
export type SavingsInputsBody = z.input<typeof savingsInputsBody>

export interface SavingsInputs {
  defaultLoad: number
  loads: LoadInput[]
  costPerRevenueHour: number | null
  currency: string
  costYear: number
  layoverShare: number
}

export interface SavingsInputsDto extends SavingsInputs {
  /** Where the values come from: the corridor's own, the agency's defaults, or Fanlight's defaults. */
  source: 'corridor' | 'agency' | 'default'
  agencyId: string
  corridorId: string | null
  version: number | null
  updatedAt: string | null
  updatedBy: string | null
  /** Whether the reader may change them (planners and admins). */
  mayEdit: boolean
}

// ---- figures ---------------------------------------------------------------------------------

/** 'accepted': only rows the city agreed, with their agreed settings. 'proposed': every row as proposed. */
export const SCENARIOS = ['accepted', 'proposed'] as const
export type Scenario = (typeof SCENARIOS)[number]

export interface ScenarioDay {
  /** Mean over the day's trips of the saving through the corridor. */
  savingPerTripS: number
  /** savingPerTripS / scheduled run time. */
  shareOfRunTime: number
  vehicleHours: number
  passengerHours: number
  /** null without a cost per revenue-hour. */
  cost: number | null
}

export interface DayFigures {
  dayType: DayType
  /** Average trips of the day type through the corridor (services weighted by how often they run). */
  trips: number
  /** Mean scheduled time from the first to the last corridor stop of each trip. */
  runTimeS: number
  accepted: ScenarioDay
  proposed: ScenarioDay
}

export interface ScenarioYear {
  vehicleHours: number
  passengerHours: number
  cost: number | null
  /** Person-hours, both streets (positive: priority pays). */
  personHoursBalance: number
}

export interface Annualisation {
  basis: 'calendar' | 'scaled'
  /** The 12 months the figures cover. */
  from: string
  to: string
  feedStart: string | null
  feedEnd: string | null
  /** Days of each type in the 12 months. */
  daysOfType: Record<DayType, number>
  /** With 'scaled': per day type, days in the 12 months / days in the feed's range. */
  scale: Record<DayType, number> | null
  trips: number
  note: string
}

export interface PersonDelayBalance {
  /** Person-hours per average day of the type. */
  busPassengersSaved: number
  mainStreetOccupantsSaved: number
  crossStreetOccupantsLost: number
  balance: number
}

export interface IntersectionSavingsDto {
  rowId: string
  position: number
  intersectionId: string
  intersectionName: string
  jurisdictionName: string
  status: RowStatus
  distanceM: number | null
  /** Buses crossing on an average day of the type. */
  buses: number
  /** Trip-weighted saving per bus over the periods, as proposed (the agreed figure is this or 0). */
  savingPerBusS: number
  acceptedVehicleHoursPerDay: number
  proposedVehicleHoursPerDay: number
  acceptedVehicleHoursPerYear: number
  proposedVehicleHoursPerYear: number
  /** Worst period. */
  crossExtraDelayPerVehS: number
  /** Person-hours per day, as proposed. */
  personHoursBalance: number
  /** Periods without figures (not evaluated, no plan, an error). */
  periodsMissing: number
  stale: boolean
}

export interface PeriodSavingsDto {
  periodId: string
  periodName: string
  startTime: string
  endTime: string
  dayType: DayType
  /** Trips entering the corridor in the period, per average day. */
  trips: number
  runTimeS: number
  acceptedSavingPerTripS: number
  proposedSavingPerTripS: number
  acceptedVehicleHours: number
  proposedVehicleHours: number
  acceptedPassengerHours: number
  proposedPassengerHours: number
}

export interface HourPoint {
  hour: number
  trips: number
  /** Mean scheduled run time of the trips entering in that hour. */
  scheduledS: number
  acceptedS: number
  proposedS: number
}

export interface RunTimeStats { meanS: number; p85S: number; p95S: number }

export interface ReliabilityDto {
  periodId: string
  periodName: string
  dayType: DayType
  trips: number
  /** Median scheduled run time of the trips through the whole corridor. */
  scheduledS: number
  without: RunTimeStats
  accepted: RunTimeStats
  proposed: RunTimeStats
  /** Intersections without a delay distribution in the period (counted as no delay, no change). */
  intersectionsMissing: number
}

export interface FleetLine {
  routeId: string
  periodId: string
  periodName: string
  dayType: DayType
  headwayMin: number
  roundTripMin: number
  /** The opposite direction's run is not in the feed: the round trip is twice this direction's. */
  oppositeAssumed: boolean
  cycleMin: { without: number; accepted: number; proposed: number }
  vehicles: { without: number; accepted: number; proposed: number }
}

export interface FleetRouteDto {
  routeId: string
  routeName: string
  /** Most vehicles any period of the day type needs. */
  peak: { without: number; accepted: number; proposed: number }
  lines: FleetLine[]
}

export interface FleetDto {
  dayType: DayType
  routes: FleetRouteDto[]
  /** Most vehicles the corridor's routes need together in any one period. */
  peak: { without: number; accepted: number; proposed: number }
  /** A bus can come out of the peak fleet. */
  busSaved: { accepted: boolean; proposed: boolean }
}

export interface StatusSharesDto {
  counts: Record<RowStatus, number>
  rows: number
  /** Shares of the rows: agreed, still open (draft, awaiting the city, change asked), refused. */
  accepted: number
  pending: number
  refused: number
}

export interface CorridorSavingsDto {
  corridor: { id: string; name: string; lengthM: number; routeIds: string[]; feedId: number }
  proposal: { id: string; name: string; status: 'draft' | 'submitted'; version: number; evaluatedAt: string | null } | null
  schedule: { feedId: number; feedName: string }
  inputs: SavingsInputsDto
  annualisation: Annualisation
  status: StatusSharesDto
  days: DayFigures[]
  annual: Record<Scenario, ScenarioYear>
  personDelay: Record<DayType, Record<Scenario, PersonDelayBalance>>
  intersections: Record<DayType, IntersectionSavingsDto[]>
  periods: PeriodSavingsDto[]
  hourly: Record<DayType, HourPoint[]>
  reliability: ReliabilityDto[]
  fleet: FleetDto[]
  assumptions: string[]
  warnings: string[]
}

export interface CorridorComparisonDto {
  corridorId: string
  corridorName: string
  feedId: number
  proposalName: string | null
  intersections: number
  weekdayTrips: number
  acceptedSavingPerTripS: number
  proposedSavingPerTripS: number
  acceptedShareOfRunTime: number
  acceptedVehicleHoursPerYear: number
  proposedVehicleHoursPerYear: number
  acceptedCostPerYear: number | null
  currency: string
  acceptedPassengerHoursPerYear: number
  peakBuses: { without: number; accepted: number; proposed: number }
  status: StatusSharesDto
}

export interface DashboardDto {
  /** Figures of the corridor asked for; null when no corridorId was given. */
  corridor: CorridorSavingsDto | null
  /** Every corridor (of the feed, when feedId is given) side by side; empty when corridorId was given. */
  corridors: CorridorComparisonDto[]
}

export interface ProposalReportDto {
  generatedAt: string
  figures: CorridorSavingsDto
}

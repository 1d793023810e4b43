// The corridor's schedule: every run of its trips over its stops, and the figures the corridor
// page shows. Also what an evaluation needs to find the buses that cross an approach.
import type { DbOrTx } from '../signals/rows'
import { frequencyRunsOf, serviceDaysOf, stopTimesAt, tripsOf } from './gtfs-queries'
import type { CorridorRow, CorridorStopRow } from './rows'
import type { CorridorRun } from '../../../shared/corridors/schedule'
import { daysOfType, serviceShare, zeroPerDayType, type PerDayType } from '../../../shared/corridors/day-types'
import { dayOfIso } from '../../../shared/gtfs/date'

export interface CorridorSchedule {
  runs: CorridorRun[]
  /** Days of each type in the feed's service range. */
  serviceDays: PerDayType
  /** How often each service runs on an average day of each type (1 = every such day). */
  share(serviceId: string): PerDayType
}

/**
 * Runs of the corridor's trips (routes and direction) that serve at least two corridor stops in
 * corridor order. A trip described by frequencies.txt gives one run per start, shifted.
 */
export async function corridorSchedule(
  db: DbOrTx, corridor: CorridorRow, stops: readonly CorridorStopRow[],
  feed: { serviceStart: string | null; serviceEnd: string | null },
): Promise<CorridorSchedule> {
  const trips = await tripsOf(db, corridor.feedVersionId, corridor.routeIds, corridor.directionId)
  const tripIds = trips.map((t) => t.tripId)
  const index = new Map(stops.map((s) => [s.stopId, s.seq]))
  const times = await stopTimesAt(db, corridor.feedVersionId, tripIds, stops.map((s) => s.stopId))
  const passesByTrip = new Map<string, { stop: number; arrivalS: number; departureS: number }[]>()
  for (const st of times) {
    const stop = index.get(st.stopId)!
    const list = passesByTrip.get(st.tripId) ?? []
    // Keep corridor order: a stop the trip visits again further on (a loop) is not a corridor pass.
    if (!list.length || stop > list[list.length - 1].stop) list.push({ stop, arrivalS: st.arrivalS, departureS: st.departureS })
    passesByTrip.set(st.tripId, list)
  }
  const shifts = new Map<string, number[]>()
  for (const f of await frequencyRunsOf(db, corridor.feedVersionId, tripIds)) {
    shifts.set(f.tripId, [...(shifts.get(f.tripId) ?? []), f.shiftS])
  }
  const runs: CorridorRun[] = []
  for (const t of trips) {
    const passes = passesByTrip.get(t.tripId)
    if (!passes || passes.length < 2) continue
    for (const shiftS of shifts.get(t.tripId) ?? [0]) runs.push({ tripId: t.tripId, routeId: t.routeId, serviceId: t.serviceId, shiftS, passes })
  }

  const serviceIds = [...new Set(runs.map((r) => r.serviceId))]
  const days = await serviceDaysOf(db, corridor.feedVersionId, serviceIds)
  const all = [...days.values()].flat()
  const start = feed.serviceStart ? dayOfIso(feed.serviceStart) : all.length ? Math.min(...all) : 0
  const end = feed.serviceEnd ? dayOfIso(feed.serviceEnd) : all.length ? Math.max(...all) : -1
  const serviceDays = end >= start ? daysOfType(start, end) : zeroPerDayType()
  const shares = new Map(serviceIds.map((id) => [id, serviceShare(days.get(id) ?? [], serviceDays, start, end)]))
  return { runs, serviceDays, share: (id) => shares.get(id) ?? zeroPerDayType() }
}

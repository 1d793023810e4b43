// What the savings need from a corridor's schedule, worked out once per feed version, corridor
// stops, approaches and periods: for every run of the corridor's trips, when it enters and
// leaves the corridor and in which period it crosses each intersection; every trip of the
// corridor's routes in both directions (for round trips); each service's dates. Feed versions
// never change, so the digest is stored and rebuilt only when the approaches or periods move.
import { minuteOfDay, timeAtDistance, type CorridorRun } from '../corridors/schedule'
import { inWindow, type TimeWindow } from '../signals/time-of-day'

export interface DigestPeriod extends TimeWindow { id: string; name: string }

/** [route index, service index, entry s, exit s, crossing periods] with one character per approach. */
export type DigestRun = [number, number, number, number, string]
/** [route index, direction_id, service index, first departure s, duration s] */
export type DigestTrip = [number, number, number, number, number]

export interface ScheduleDigest {
  feedId: number
  directionId: number
  approachIds: string[]
  periods: DigestPeriod[]
  routes: string[]
  services: string[]
  runs: DigestRun[]
  trips: DigestTrip[]
  /** Day numbers each service runs on. */
  serviceDates: Record<string, number[]>
  feedRange: { startDay: number; endDay: number } | null
}

const NO_PERIOD = '.'
const encode = (i: number) => (i < 0 ? NO_PERIOD : String.fromCharCode(48 + i))
export const decodePeriod = (c: string) => (c === NO_PERIOD ? -1 : c.charCodeAt(0) - 48)

/**
 * When the run crosses each approach (GTFS seconds, its shift included), interpolated along
 * the corridor's shape between the stop times of the stops either side: linear in the stops'
 * stored distances, from the departure at the stop before to the arrival at the stop after.
 * Null where the run does not serve that stretch.
 */
export function crossingTimes(run: CorridorRun, stopDistancesM: readonly number[], approachDistancesM: readonly number[]): (number | null)[] {
  return approachDistancesM.map((d) => timeAtDistance(run, stopDistancesM, d))
}

/** Index of the period whose window holds the time (times past midnight wrap), or -1. */
export function periodIndexAt(periods: readonly TimeWindow[], gtfsSeconds: number): number {
  const m = minuteOfDay(gtfsSeconds)
  return periods.findIndex((p) => inWindow(p, m))
}

export interface DigestSource {
  feedId: number
  directionId: number
  runs: readonly CorridorRun[]
  stopDistancesM: readonly number[]
  approaches: readonly { id: string; distanceM: number }[]
  periods: readonly DigestPeriod[]
  /** Every trip of the corridor's routes (both directions): first departure and last arrival, shift included. */
  trips: readonly { routeId: string; directionId: number; serviceId: string; startS: number; endS: number }[]
  serviceDates: ReadonlyMap<string, readonly number[]>
  feedRange: { startDay: number; endDay: number } | null
}

export function buildDigest(src: DigestSource): ScheduleDigest {
  const routes: string[] = []
  const services: string[] = []
  const indexIn = (list: string[], id: string) => {
    let i = list.indexOf(id)
    if (i < 0) { i = list.length; list.push(id) }
    return i
  }
  const distances = src.approaches.map((a) => a.distanceM)
  const runs: DigestRun[] = src.runs.map((run) => {
    const crossings = crossingTimes(run, src.stopDistancesM, distances)
    const last = run.passes[run.passes.length - 1]
    return [
      indexIn(routes, run.routeId), indexIn(services, run.serviceId),
      run.passes[0].departureS + run.shiftS, last.arrivalS + run.shiftS,
      crossings.map((t) => encode(t === null ? -1 : periodIndexAt(src.periods, t))).join(''),
    ]
  })
  const trips: DigestTrip[] = src.trips.map((t) => [indexIn(routes, t.routeId), t.directionId, indexIn(services, t.serviceId), t.startS, t.endS - t.startS])
  const serviceDates: Record<string, number[]> = {}
  for (const s of services) serviceDates[s] = [...(src.serviceDates.get(s) ?? [])]
  return {
    feedId: src.feedId, directionId: src.directionId, approachIds: src.approaches.map((a) => a.id),
    periods: src.periods.map((p) => ({ id: p.id, name: p.name, startTime: p.startTime, endTime: p.endTime })),
    routes, services, runs, trips, serviceDates, feedRange: src.feedRange,
  }
}

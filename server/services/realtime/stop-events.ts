// Observed stop times from a TripUpdate, following the GTFS-realtime reference for StopTimeUpdate:
// - an update is matched to the schedule by stop_sequence, else by stop_id (in trip order);
// - in a StopTimeEvent an absolute time wins over a delay;
// - a delay holds for the later stops of the trip until the next update gives another one
//   (and the departure of a stop inherits the arrival's delay when it has none of its own);
// - SKIPPED stops get no time but pass the delay on; NO_DATA ends what is known downstream;
// - a CANCELED trip has no observed times.
// Only events at or before the update's own timestamp are observations; later ones are predictions.
import type { StopTimeEventReading, TripUpdateReading } from './decode'

export interface ScheduledStop {
  stopSequence: number
  stopId: string
  /** Seconds after the service day's "noon minus 12 h", as GTFS stop_times counts them. */
  arrivalS: number
  departureS: number
}

export interface ObservedStopTime {
  stopSequence: number
  stopId: string
  /** Unix seconds. */
  arrivalS: number | null
  departureS: number | null
  /** Observed minus scheduled arrival (else departure), seconds, positive = late. */
  delayS: number
}

const SKIPPED = 1
const NO_DATA = 2
const CANCELED = 3

function eventTime(ev: StopTimeEventReading | null, scheduledUnix: number, carriedDelay: number | null): number | null {
  if (ev?.timeS != null) return ev.timeS
  if (ev?.delayS != null) return scheduledUnix + ev.delayS
  return carriedDelay === null ? null : scheduledUnix + carriedDelay
}

/**
 * Resolves every scheduled stop from the first updated one on. Stops before the first update get
 * nothing: the standard propagates delay downstream only.
 */
export function resolveTripUpdate(
  update: Pick<TripUpdateReading, 'stops' | 'timeS' | 'tripRelationship'>,
  schedule: ScheduledStop[],
  serviceDayStartUnix: number,
): ObservedStopTime[] {
  if (update.tripRelationship === CANCELED || update.stops.length === 0) return []
  // Pair each update with the index of its scheduled stop.
  const byIndex = new Map<number, TripUpdateReading['stops'][number]>()
  let cursor = 0
  for (const u of update.stops) {
    let idx = -1
    if (u.stopSequence !== null) idx = schedule.findIndex((s) => s.stopSequence === u.stopSequence)
    else if (u.stopId !== null) {
      idx = schedule.findIndex((s, i) => i >= cursor && s.stopId === u.stopId)
    }
    if (idx < 0) continue
    byIndex.set(idx, u)
    cursor = idx + 1
  }
  if (byIndex.size === 0) return []
  const first = Math.min(...byIndex.keys())

  const out: ObservedStopTime[] = []
  let delay: number | null = null
  for (let i = first; i < schedule.length; i++) {
    const s = schedule[i]
    const schedArr = serviceDayStartUnix + s.arrivalS
    const schedDep = serviceDayStartUnix + s.departureS
    const u = byIndex.get(i)
    if (u?.relationship === NO_DATA) { delay = null; continue }
    if (u?.relationship === SKIPPED) continue
    const arrival = eventTime(u?.arrival ?? null, schedArr, delay)
    if (arrival !== null) delay = arrival - schedArr
    const departure = eventTime(u?.departure ?? null, schedDep, delay)
    if (departure !== null) delay = departure - schedDep
    if (arrival === null && departure === null) continue
    const observedArr = arrival !== null && arrival <= update.timeS ? arrival : null
    const observedDep = departure !== null && departure <= update.timeS ? departure : null
    if (observedArr === null && observedDep === null) break
    out.push({
      stopSequence: s.stopSequence,
      stopId: s.stopId,
      arrivalS: observedArr,
      departureS: observedDep,
      delayS: observedArr !== null ? observedArr - schedArr : observedDep! - schedDep,
    })
  }
  return out
}

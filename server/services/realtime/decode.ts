// Decodes one GTFS-realtime FeedMessage (gtfs-realtime.proto, the open standard) and checks the
// parts Fanlight relies on. Each problem is reported with the file and the field it concerns so
// that one bad file in a batch can be named and skipped while the rest goes on.
import { createHash } from 'node:crypto'
import GtfsRealtimeBindings from 'gtfs-realtime-bindings'
import type { Clock } from '../../clock'

const rt = GtfsRealtimeBindings.transit_realtime

export const SUPPORTED_VERSIONS = ['1.0', '2.0'] as const

export type RealtimeErrorCode =
  | 'empty_file' | 'not_feed_message' | 'truncated' | 'version' | 'differential'
  | 'no_timestamp' | 'future_timestamp' | 'old_timestamp' | 'bad_position'

/** A problem with one uploaded file; the file is skipped, the batch goes on. */
export class RealtimeFileError extends Error {
  constructor(readonly code: RealtimeErrorCode, message: string, readonly field?: string) {
    super(message)
  }
}

export interface TimeLimits {
  /** How far after the clock a timestamp may be (feed clocks drift a little). */
  futureToleranceS: number
  /** How far before the clock a snapshot may be (archives of a before period are months old). */
  maxAgeS: number
}

export const DEFAULT_TIME_LIMITS: TimeLimits = { futureToleranceS: 300, maxAgeS: 3 * 366 * 86_400 }

/** One vehicle position, with absent optional fields kept as null (not the proto defaults). */
export interface VehicleReading {
  entityId: string
  tripId: string | null
  routeId: string | null
  startDate: string | null
  startTime: string | null
  vehicleId: string | null
  /** Unix seconds of the reading: the vehicle's own timestamp, else the header's. */
  timeS: number
  lat: number
  lon: number
  bearing: number | null
  speedMps: number | null
  /** INCOMING_AT = 0, STOPPED_AT = 1, IN_TRANSIT_TO = 2 (the standard's default). */
  status: 0 | 1 | 2
  stopId: string | null
  stopSequence: number | null
}

export interface StopTimeEventReading {
  timeS: number | null
  delayS: number | null
}

export interface StopTimeUpdateReading {
  stopSequence: number | null
  stopId: string | null
  arrival: StopTimeEventReading | null
  departure: StopTimeEventReading | null
  /** SCHEDULED = 0, SKIPPED = 1, NO_DATA = 2, UNSCHEDULED = 3. */
  relationship: number
}

export interface TripUpdateReading {
  entityId: string
  tripId: string | null
  routeId: string | null
  startDate: string | null
  startTime: string | null
  vehicleId: string | null
  /** Unix seconds the update was measured: its own timestamp, else the header's. */
  timeS: number
  /** Trip-level schedule relationship; CANCELED = 3 trips carry no observed times. */
  tripRelationship: number
  stops: StopTimeUpdateReading[]
}

export interface DecodedSnapshot {
  contentHash: string
  bytes: number
  gtfsRealtimeVersion: string
  headerTimeS: number
  entityCount: number
  vehicles: VehicleReading[]
  tripUpdates: TripUpdateReading[]
  /** Alerts and other entity kinds that carry no run times. */
  otherEntities: number
  deletedEntities: number
}

type Obj = Record<string, unknown>
const has = (o: unknown, key: string) => o != null && Object.prototype.hasOwnProperty.call(o, key)

/** Longs come back as Long objects from protobufjs; Unix seconds fit a double exactly. */
function toNumber(v: unknown): number {
  if (typeof v === 'number') return v
  if (v && typeof (v as { toNumber?: unknown }).toNumber === 'function') return (v as { toNumber(): number }).toNumber()
  return Number(v)
}

function opt<T>(o: unknown, key: string, map: (v: unknown) => T): T | null {
  return has(o, key) ? map((o as Obj)[key]) : null
}
const str = (v: unknown) => String(v)

export function contentHash(data: Uint8Array): string {
  return createHash('sha256').update(data).digest('hex')
}

function parseMessage(data: Uint8Array) {
  if (data.length === 0) throw new RealtimeFileError('empty_file', 'The file is empty.')
  try {
    return rt.FeedMessage.decode(data)
  } catch (err) {
    const msg = err instanceof Error ? err.message : String(err)
    // protobufjs reads past the end of a cut-off buffer; any other failure means other bytes.
    if (/index out of range/.test(msg)) {
      throw new RealtimeFileError('truncated', `The file ends in the middle of a FeedMessage (${msg}); it looks truncated.`)
    }
    if (/gtfsRealtimeVersion/.test(msg)) {
      throw new RealtimeFileError('version', 'header.gtfs_realtime_version is missing; it is required.', 'header.gtfs_realtime_version')
    }
    throw new RealtimeFileError('not_feed_message', `The file is not a GTFS-realtime FeedMessage (${msg}).`)
  }
}

function checkTime(timeS: number, field: string, nowS: number, limits: TimeLimits) {
  if (timeS > nowS + limits.futureToleranceS) {
    throw new RealtimeFileError('future_timestamp',
      `${field} ${timeS} (${new Date(timeS * 1000).toISOString()}) is more than ${limits.futureToleranceS} s after the server clock `
      + `(${new Date(nowS * 1000).toISOString()}); is it in milliseconds instead of seconds?`, field)
  }
  if (timeS < nowS - limits.maxAgeS) {
    throw new RealtimeFileError('old_timestamp',
      `${field} ${timeS} (${new Date(timeS * 1000).toISOString()}) is more than ${Math.round(limits.maxAgeS / 86_400)} days before the server clock.`, field)
  }
}

function tripFields(trip: unknown) {
  return {
    tripId: opt(trip, 'tripId', str),
    routeId: opt(trip, 'routeId', str),
    startDate: opt(trip, 'startDate', str),
    startTime: opt(trip, 'startTime', str),
  }
}

function stopEvent(ev: unknown): StopTimeEventReading | null {
  if (ev == null) return null
  const timeS = opt(ev, 'time', toNumber)
  const delayS = opt(ev, 'delay', Number)
  if (timeS === null && delayS === null) return null
  return { timeS, delayS }
}

/**
 * Decodes and validates one file. Throws RealtimeFileError for a file that must not be stored;
 * everything returned is safe to store.
 */
export function decodeSnapshot(data: Uint8Array, clock: Clock, limits: TimeLimits = DEFAULT_TIME_LIMITS): DecodedSnapshot {
  const msg = parseMessage(data)
  const header = msg.header
  const version = header.gtfsRealtimeVersion
  if (!(SUPPORTED_VERSIONS as readonly string[]).includes(version)) {
    throw new RealtimeFileError('version', `header.gtfs_realtime_version is "${version}"; Fanlight reads "1.0" and "2.0".`, 'header.gtfs_realtime_version')
  }
  if (has(header, 'incrementality') && header.incrementality === rt.FeedHeader.Incrementality.DIFFERENTIAL) {
    throw new RealtimeFileError('differential', 'header.incrementality is DIFFERENTIAL; upload FULL_DATASET snapshots.', 'header.incrementality')
  }
  if (!has(header, 'timestamp') || toNumber(header.timestamp) === 0) {
    throw new RealtimeFileError('no_timestamp', 'header.timestamp is missing; each snapshot needs the time it was taken.', 'header.timestamp')
  }
  const headerTimeS = toNumber(header.timestamp)
  const nowS = Math.floor(clock.now().getTime() / 1000)
  checkTime(headerTimeS, 'header.timestamp', nowS, limits)

  const vehicles: VehicleReading[] = []
  const tripUpdates: TripUpdateReading[] = []
  let otherEntities = 0
  let deletedEntities = 0
  msg.entity.forEach((e, i) => {
    const where = `entity[${i}] (id "${e.id}")`
    if (has(e, 'isDeleted') && e.isDeleted) { deletedEntities++; return }
    let counted = false
    if (e.vehicle) {
      counted = true
      const v = e.vehicle
      if (v.position) {
        const p = v.position
        if (!(Math.abs(p.latitude) <= 90) || !(Math.abs(p.longitude) <= 180)) {
          throw new RealtimeFileError('bad_position', `${where}: vehicle.position (${p.latitude}, ${p.longitude}) is not a latitude/longitude.`, `${where}.vehicle.position`)
        }
        const timeS = has(v, 'timestamp') ? toNumber(v.timestamp) : headerTimeS
        checkTime(timeS, `${where}.vehicle.timestamp`, nowS, limits)
        vehicles.push({
          entityId: e.id,
          ...tripFields(v.trip),
          vehicleId: opt(v.vehicle, 'id', str),
          timeS,
          lat: p.latitude,
          lon: p.longitude,
          bearing: opt(p, 'bearing', Number),
          speedMps: opt(p, 'speed', Number),
          status: (has(v, 'currentStatus') ? v.currentStatus : 2) as 0 | 1 | 2,
          stopId: opt(v, 'stopId', str),
          stopSequence: opt(v, 'currentStopSequence', Number),
        })
      }
    }
    if (e.tripUpdate) {
      counted = true
      const u = e.tripUpdate
      const timeS = has(u, 'timestamp') ? toNumber(u.timestamp) : headerTimeS
      checkTime(timeS, `${where}.trip_update.timestamp`, nowS, limits)
      tripUpdates.push({
        entityId: e.id,
        ...tripFields(u.trip),
        vehicleId: opt(u.vehicle, 'id', str),
        timeS,
        tripRelationship: has(u.trip, 'scheduleRelationship') ? Number(u.trip.scheduleRelationship) : 0,
        stops: (u.stopTimeUpdate ?? []).map((s) => ({
          stopSequence: opt(s, 'stopSequence', Number),
          stopId: opt(s, 'stopId', str),
          arrival: stopEvent(s.arrival),
          departure: stopEvent(s.departure),
          relationship: has(s, 'scheduleRelationship') ? Number(s.scheduleRelationship) : 0,
        })),
      })
    }
    if (!counted) otherEntities++
  })

  return {
    contentHash: contentHash(data),
    bytes: data.length,
    gtfsRealtimeVersion: version,
    headerTimeS,
    entityCount: msg.entity.length,
    vehicles,
    tripUpdates,
    otherEntities,
    deletedEntities,
  }
}

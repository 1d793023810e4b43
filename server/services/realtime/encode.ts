// Writes FeedMessages for the local fake feed, the demo snapshots and the benchmark.
import GtfsRealtimeBindings from 'gtfs-realtime-bindings'

const rt = GtfsRealtimeBindings.transit_realtime

export interface VehicleToEncode {
  entityId: string
  tripId: string
  routeId?: string
  startDate: string
  /** For runs of a frequency-based trip. */
  startTime?: string
  vehicleId: string
  timeS: number
  lat: number
  lon: number
  bearing?: number
  speedMps?: number
  status?: 0 | 1 | 2
  stopId?: string
  stopSequence?: number
}

export interface TripUpdateToEncode {
  entityId: string
  tripId: string
  startDate: string
  startTime?: string
  vehicleId: string
  timeS: number
  stops: { stopSequence: number; arrivalS?: number; departureS?: number; delayS?: number }[]
}

export function encodeVehicleFeed(headerTimeS: number, vehicles: VehicleToEncode[], tripUpdates: TripUpdateToEncode[] = []): Uint8Array {
  const msg = rt.FeedMessage.create({
    header: { gtfsRealtimeVersion: '2.0', incrementality: rt.FeedHeader.Incrementality.FULL_DATASET, timestamp: headerTimeS },
    entity: [...vehicles.map((v) => ({
      id: v.entityId,
      vehicle: {
        trip: { tripId: v.tripId, routeId: v.routeId, startDate: v.startDate, startTime: v.startTime },
        vehicle: { id: v.vehicleId },
        position: { latitude: v.lat, longitude: v.lon, bearing: v.bearing, speed: v.speedMps },
        timestamp: v.timeS,
        currentStatus: v.status,
        stopId: v.stopId,
        currentStopSequence: v.stopSequence,
      },
    })), ...tripUpdates.map((u) => ({
      id: u.entityId,
      tripUpdate: {
        trip: { tripId: u.tripId, startDate: u.startDate, startTime: u.startTime },
        vehicle: { id: u.vehicleId },
        timestamp: u.timeS,
        stopTimeUpdate: u.stops.map((s) => ({
          stopSequence: s.stopSequence,
          arrival: s.arrivalS !== undefined ? { time: s.arrivalS } : s.delayS !== undefined ? { delay: s.delayS } : undefined,
          departure: s.departureS !== undefined ? { time: s.departureS } : undefined,
        })),
      },
    }))],
  })
  return rt.FeedMessage.encode(msg).finish()
}

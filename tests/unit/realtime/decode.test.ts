import { describe, expect, it } from 'vitest'
import GtfsRealtimeBindings from 'gtfs-realtime-bindings'
import protobuf from 'protobufjs'
import { decodeSnapshot, RealtimeFileError } from '../../../server/services/realtime/decode'
import { encodeVehicleFeed } from '../../../server/services/realtime/encode'

// Field numbers, enum values and defaults below are those of gtfs-realtime.proto (the open
// standard's schema), encoded with the registry package gtfs-realtime-bindings.
const rt = GtfsRealtimeBindings.transit_realtime
const NOW_S = 1_714_986_000 // 2024-05-06T09:00:00Z
const clock = { now: () => new Date(NOW_S * 1000) }

function encode(message: Record<string, unknown>): Uint8Array {
  return rt.FeedMessage.encode(rt.FeedMessage.fromObject(message)).finish()
}

function failure(data: Uint8Array): RealtimeFileError {
  try {
    decodeSnapshot(data, clock)
  } catch (err) {
    if (err instanceof RealtimeFileError) return err
    throw err
  }
  throw new Error('expected the file to be refused')
}

describe('decodeSnapshot: valid feeds', () => {
  it('reads vehicle positions, keeping absent optional fields absent', () => {
    const data = encode({
      header: { gtfsRealtimeVersion: '2.0', incrementality: 'FULL_DATASET', timestamp: NOW_S - 60 },
      entity: [
        { id: 'e1', vehicle: { trip: { tripId: 'T1', startDate: '20240506' }, vehicle: { id: 'bus-41' }, position: { latitude: 52.1, longitude: 4.3, speed: 8.5 }, timestamp: NOW_S - 65, currentStatus: 'STOPPED_AT', stopId: 'S3', currentStopSequence: 3 } },
        // No status, no timestamp: the standard's defaults are IN_TRANSIT_TO and "the header's time".
        { id: 'e2', vehicle: { trip: { tripId: 'T2' }, position: { latitude: 52.2, longitude: 4.4 } } },
        { id: 'e3', alert: { headerText: { translation: [{ text: 'Detour' }] } } },
        { id: 'e4', isDeleted: true, vehicle: { position: { latitude: 0, longitude: 0 } } },
      ],
    })
    const s = decodeSnapshot(data, clock)
    expect(s.gtfsRealtimeVersion).toBe('2.0')
    expect(s.headerTimeS).toBe(NOW_S - 60)
    expect(s.entityCount).toBe(4)
    expect(s.otherEntities).toBe(1)
    expect(s.deletedEntities).toBe(1)
    expect(s.contentHash).toMatch(/^[0-9a-f]{64}$/)
    expect(s.vehicles).toHaveLength(2)
    expect(s.vehicles[0]).toMatchObject({ entityId: 'e1', tripId: 'T1', startDate: '20240506', vehicleId: 'bus-41', timeS: NOW_S - 65, status: 1, stopId: 'S3', stopSequence: 3, bearing: null })
    expect(s.vehicles[0].lat).toBeCloseTo(52.1, 5) // float32 on the wire
    expect(s.vehicles[0].speedMps).toBeCloseTo(8.5, 5)
    expect(s.vehicles[1]).toMatchObject({ tripId: 'T2', startDate: null, vehicleId: null, timeS: NOW_S - 60, status: 2, stopId: null, stopSequence: null, speedMps: null })
  })

  it('reads trip updates with times, delays, skipped stops and a cancelled trip', () => {
    const data = encode({
      header: { gtfsRealtimeVersion: '1.0', timestamp: NOW_S },
      entity: [
        {
          id: 'u1',
          tripUpdate: {
            trip: { tripId: 'T1', startDate: '20240506' },
            timestamp: NOW_S - 10,
            stopTimeUpdate: [
              { stopSequence: 1, arrival: { time: NOW_S - 300 }, departure: { delay: 45 } },
              { stopId: 'S2', scheduleRelationship: 'SKIPPED' },
              { stopSequence: 3, arrival: { delay: -20 } },
            ],
          },
        },
        { id: 'u2', tripUpdate: { trip: { tripId: 'T9', scheduleRelationship: 'CANCELED' } } },
      ],
    })
    const s = decodeSnapshot(data, clock)
    expect(s.gtfsRealtimeVersion).toBe('1.0')
    expect(s.tripUpdates).toHaveLength(2)
    const [u1, u2] = s.tripUpdates
    expect(u1.timeS).toBe(NOW_S - 10)
    expect(u1.stops).toEqual([
      { stopSequence: 1, stopId: null, arrival: { timeS: NOW_S - 300, delayS: null }, departure: { timeS: null, delayS: 45 }, relationship: 0 },
      { stopSequence: null, stopId: 'S2', arrival: null, departure: null, relationship: 1 },
      { stopSequence: 3, stopId: null, arrival: { timeS: null, delayS: -20 }, departure: null, relationship: 0 },
    ])
    expect(u2).toMatchObject({ tripId: 'T9', tripRelationship: 3, timeS: NOW_S, stops: [] })
  })

  it('gives the same content hash to the same bytes and another to other bytes', () => {
    const a = decodeSnapshot(encodeVehicleFeed(NOW_S, [{ entityId: 'v', tripId: 'T', startDate: '20240506', vehicleId: 'b', timeS: NOW_S, lat: 1, lon: 2 }]), clock)
    const b = decodeSnapshot(encodeVehicleFeed(NOW_S, [{ entityId: 'v', tripId: 'T', startDate: '20240506', vehicleId: 'b', timeS: NOW_S, lat: 1, lon: 2 }]), clock)
    const c = decodeSnapshot(encodeVehicleFeed(NOW_S, [{ entityId: 'v', tripId: 'T', startDate: '20240506', vehicleId: 'b', timeS: NOW_S, lat: 1, lon: 2.001 }]), clock)
    expect(a.contentHash).toBe(b.contentHash)
    expect(a.contentHash).not.toBe(c.contentHash)
  })
})

describe('decodeSnapshot: every bad input is refused with a code and a field', () => {
  const good = encode({ header: { gtfsRealtimeVersion: '2.0', timestamp: NOW_S }, entity: [{ id: 'v', vehicle: { trip: { tripId: 'T' }, position: { latitude: 1, longitude: 2 } } }] })

  it('an empty file', () => {
    expect(failure(new Uint8Array(0)).code).toBe('empty_file')
  })

  it('a file that is not a FeedMessage (text, a zip header, a message without header)', () => {
    expect(failure(new TextEncoder().encode('trip_id,stop_id\nT1,S1\n')).code).toBe('not_feed_message')
    expect(failure(new Uint8Array([0x50, 0x4b, 0x03, 0x04, 0, 0, 0, 0])).code).toBe('not_feed_message')
    // Field 2 (entity) alone: the required header (field 1) is missing.
    const noHeader = rt.FeedEntity.encode(rt.FeedEntity.fromObject({ id: 'x' })).finish()
    const onlyEntity = new Uint8Array([0x12, noHeader.length, ...noHeader])
    const err = failure(onlyEntity)
    expect(err.code).toBe('not_feed_message')
    expect(err.message).toContain('header')
  })

  it('a truncated file', () => {
    const err = failure(good.subarray(0, good.length - 4))
    expect(err.code).toBe('truncated')
    expect(err.message).toMatch(/truncated/)
  })

  it('a wrong gtfs_realtime_version', () => {
    const err = failure(encode({ header: { gtfsRealtimeVersion: '3.0', timestamp: NOW_S } }))
    expect(err).toMatchObject({ code: 'version', field: 'header.gtfs_realtime_version' })
    expect(err.message).toContain('"3.0"')
  })

  it('a missing gtfs_realtime_version (a required field)', () => {
    // FeedHeader with only field 3 (timestamp, varint): the required field 1 is absent.
    const header = protobuf.Writer.create().uint32((3 << 3) | 0).uint64(NOW_S).finish()
    const data = new Uint8Array([0x0a, header.length, ...header])
    expect(failure(data)).toMatchObject({ code: 'version', field: 'header.gtfs_realtime_version' })
  })

  it('a DIFFERENTIAL feed', () => {
    expect(failure(encode({ header: { gtfsRealtimeVersion: '2.0', incrementality: 'DIFFERENTIAL', timestamp: NOW_S } })).code).toBe('differential')
  })

  it('a missing header timestamp', () => {
    expect(failure(encode({ header: { gtfsRealtimeVersion: '2.0' } }))).toMatchObject({ code: 'no_timestamp', field: 'header.timestamp' })
  })

  it('a header timestamp in the future beyond the tolerance (and one just inside it is fine)', () => {
    expect(() => decodeSnapshot(encode({ header: { gtfsRealtimeVersion: '2.0', timestamp: NOW_S + 299 } }), clock)).not.toThrow()
    const err = failure(encode({ header: { gtfsRealtimeVersion: '2.0', timestamp: NOW_S + 301 } }))
    expect(err).toMatchObject({ code: 'future_timestamp', field: 'header.timestamp' })
    // Milliseconds instead of seconds: the usual cause, named in the message.
    expect(failure(encode({ header: { gtfsRealtimeVersion: '2.0', timestamp: NOW_S * 1000 } })).message).toContain('milliseconds')
  })

  it('a header timestamp far in the past', () => {
    expect(failure(encode({ header: { gtfsRealtimeVersion: '2.0', timestamp: 86_400 } }))).toMatchObject({ code: 'old_timestamp', field: 'header.timestamp' })
  })

  it('an entity timestamp in the future, naming the entity', () => {
    const err = failure(encode({
      header: { gtfsRealtimeVersion: '2.0', timestamp: NOW_S },
      entity: [{ id: 'bus-7', vehicle: { position: { latitude: 1, longitude: 2 }, timestamp: NOW_S + 4000 } }],
    }))
    expect(err).toMatchObject({ code: 'future_timestamp', field: 'entity[0] (id "bus-7").vehicle.timestamp' })
  })

  it('a position that is no latitude/longitude', () => {
    const err = failure(encode({
      header: { gtfsRealtimeVersion: '2.0', timestamp: NOW_S },
      entity: [{ id: 'ok', vehicle: { position: { latitude: 1, longitude: 2 } } }, { id: 'bad', vehicle: { position: { latitude: 95, longitude: 2 } } }],
    }))
    expect(err.code).toBe('bad_position')
    expect(err.field).toBe('entity[1] (id "bad").vehicle.position')
  })
})

// The parts of a GTFS Schedule zip the realtime scenario needs (trips of some routes, their stop
// times, stops, shapes, service dates and frequency runs), read straight from the zip. Only for
// the invented demo and test feeds, which the import has already checked; a real feed goes
// through the GTFS import.
import { unzipSync, strFromU8 } from 'fflate'
import Papa from 'papaparse'
import { parseGtfsTime } from '../../../shared/gtfs/time'
import { parseGtfsDate } from '../../../shared/gtfs/date'
import { serviceDates } from '../../../shared/gtfs/service-dates'
import { frequencyStartTimes } from '../../../shared/gtfs/frequencies'

export interface ScenarioStopTime {
  stopId: string
  stopSequence: number
  /** NaN at a stop the feed leaves without times (not a timepoint); the scenario interpolates. */
  arrivalS: number
  departureS: number
}

export interface ScenarioTrip {
  tripId: string
  routeId: string
  serviceId: string
  shapeId: string
  directionId: number
  stopTimes: ScenarioStopTime[]
  /** Frequency-based runs: start times (GTFS seconds); empty for a trip with its own times. */
  runStarts: number[]
}

export interface ScenarioGtfs {
  timeZone: string
  trips: ScenarioTrip[]
  stops: Map<string, { lat: number; lon: number; name: string }>
  shapes: Map<string, { lat: number; lon: number }[]>
  /** Day numbers each service runs on. */
  serviceDays: Map<string, number[]>
}

type Row = Record<string, string>

function table(files: Record<string, Uint8Array>, name: string): Row[] {
  const data = files[name]
  if (!data) return []
  const text = strFromU8(data).replace(/^\uFEFF/, '')
  return Papa.parse<Row>(text, { header: true, skipEmptyLines: true, transformHeader: (h) => h.trim() }).data
}

export function readScenarioGtfs(zip: Uint8Array, routeIds?: readonly string[], directionId?: number): ScenarioGtfs {
  const files = unzipSync(zip, { filter: (f) => f.name.endsWith('.txt') })
  const byName = Object.fromEntries(Object.entries(files).map(([k, v]) => [k.split('/').pop()!, v]))
  const timeZone = table(byName, 'agency.txt')[0]?.agency_timezone ?? 'UTC'
  const keepRoute = (id: string) => !routeIds || routeIds.includes(id)
  const trips = new Map<string, ScenarioTrip>()
  for (const t of table(byName, 'trips.txt')) {
    if (!keepRoute(t.route_id) || !t.shape_id) continue
    if (directionId !== undefined && Number(t.direction_id || 0) !== directionId) continue
    trips.set(t.trip_id, {
      tripId: t.trip_id, routeId: t.route_id, serviceId: t.service_id, shapeId: t.shape_id,
      directionId: Number(t.direction_id || 0), stopTimes: [], runStarts: [],
    })
  }
  for (const st of table(byName, 'stop_times.txt')) {
    const trip = trips.get(st.trip_id)
    if (!trip) continue
    const arr = parseGtfsTime(st.arrival_time ?? '') ?? Number.NaN
    const dep = parseGtfsTime(st.departure_time ?? '') ?? Number.NaN
    trip.stopTimes.push({ stopId: st.stop_id, stopSequence: Number(st.stop_sequence), arrivalS: arr, departureS: dep })
  }
  for (const trip of trips.values()) trip.stopTimes.sort((a, b) => a.stopSequence - b.stopSequence)
  for (const f of table(byName, 'frequencies.txt')) {
    const trip = trips.get(f.trip_id)
    if (!trip) continue
    trip.runStarts.push(...frequencyStartTimes({ startS: parseGtfsTime(f.start_time)!, endS: parseGtfsTime(f.end_time)!, headwayS: Number(f.headway_secs) }))
  }
  const stops = new Map(table(byName, 'stops.txt').map((s) => [s.stop_id, { lat: Number(s.stop_lat), lon: Number(s.stop_lon), name: s.stop_name ?? '' }]))
  const shapes = new Map<string, { lat: number; lon: number; seq: number }[]>()
  for (const p of table(byName, 'shapes.txt')) {
    const list = shapes.get(p.shape_id) ?? []
    list.push({ lat: Number(p.shape_pt_lat), lon: Number(p.shape_pt_lon), seq: Number(p.shape_pt_sequence) })
    shapes.set(p.shape_id, list)
  }
  const rules = table(byName, 'calendar.txt').map((c) => ({
    serviceId: c.service_id,
    days: ['monday', 'tuesday', 'wednesday', 'thursday', 'friday', 'saturday', 'sunday'].map((d) => c[d] === '1'),
    startDay: parseGtfsDate(c.start_date)!,
    endDay: parseGtfsDate(c.end_date)!,
  }))
  const exceptions = table(byName, 'calendar_dates.txt').map((c) => ({
    serviceId: c.service_id, day: parseGtfsDate(c.date)!, exceptionType: (c.exception_type === '1' ? 1 : 2) as 1 | 2,
  }))
  return {
    timeZone,
    trips: [...trips.values()].filter((t) => t.stopTimes.length >= 2),
    stops,
    shapes: new Map([...shapes].map(([id, pts]) => [id, pts.sort((a, b) => a.seq - b.seq).map(({ lat, lon }) => ({ lat, lon }))])),
    serviceDays: serviceDates(rules, exceptions),
  }
}

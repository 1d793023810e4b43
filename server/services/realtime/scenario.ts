// The demo's buses as a realtime feed: every scheduled run of the chosen routes on a service day,
// simulated along its shape through the corridor's signals (bus-run.ts), read at any instant as a
// FULL_DATASET FeedMessage of VehiclePositions. The same seed, schedule and signals always give
// the same feed, so demo snapshots and tests are reproducible.
import { cumulativeDistanceM, projectOntoPolyline } from '../../../shared/gtfs/geo'
import { gtfsDate, parseGtfsDate } from '../../../shared/gtfs/date'
import { formatGtfsTime } from '../../../shared/gtfs/time'
import { seededRandom } from './statistics'
import { buildShapeLine, pointAt, type ShapeLine } from './shape-line'
import { localDate, serviceDayStart } from './service-day'
import { simulateRun, positionAt, type Knot, type PriorityRules, type RunSignal } from './bus-run'
import { encodeVehicleFeed, type VehicleToEncode } from './encode'
import type { ScenarioGtfs, ScenarioTrip } from './scenario-gtfs'

export interface ScenarioSignal {
  name: string
  lat: number
  lon: number
  cycleS: number
  greenS: number
  offsetS: number
  /** Whether priority runs here in the "after" period. */
  priority: boolean
}

export interface ScenarioOptions {
  seed: number
  signals: ScenarioSignal[]
  priority: PriorityRules
  /** GPS scatter of the reported positions, metres (about 3-5 m for bus AVL, common practice). */
  gpsErrorM?: number
}

/** A signal is on a trip's path when it lies this close to the trip's shape. */
const SIGNAL_MAX_OFFSET_M = 40

interface PreparedTrip {
  trip: ScenarioTrip
  line: ShapeLine
  stopDist: number[]
  signals: RunSignal[]
}

interface Run {
  trip: PreparedTrip
  date: string
  startTime: string | null
  knots: Knot[]
}

/** A string hash (FNV-1a), to give every run its own reproducible random stream. */
function hash(text: string): number {
  let h = 0x811c9dc5
  for (let i = 0; i < text.length; i++) {
    h ^= text.charCodeAt(i)
    h = Math.imul(h, 0x01000193)
  }
  return h >>> 0
}

export class RealtimeScenario {
  private trips: PreparedTrip[]
  private runsByDate = new Map<string, Run[]>()

  constructor(private readonly gtfs: ScenarioGtfs, private readonly opts: ScenarioOptions) {
    this.trips = gtfs.trips.flatMap((trip) => {
      const shape = gtfs.shapes.get(trip.shapeId)
      if (!shape || shape.length < 2) return []
      const line = buildShapeLine(shape)
      const lat = shape.map((p) => p.lat), lon = shape.map((p) => p.lon)
      const cum = cumulativeDistanceM(lat, lon)
      // Stops in trip order, each searched from the previous one (loops pass a stop twice).
      let seg = 0, from = 0
      const stopDist = trip.stopTimes.map((st) => {
        const s = gtfs.stops.get(st.stopId)
        if (!s) return from
        const p = projectOntoPolyline(s.lat, s.lon, lat, lon, cum, seg, from)
        seg = p.segment
        from = p.distM
        return p.distM
      })
      const signals = opts.signals.flatMap((g) => {
        const p = projectOntoPolyline(g.lat, g.lon, lat, lon, cum)
        return p.offsetM <= SIGNAL_MAX_OFFSET_M ? [{ distM: p.distM, cycleS: g.cycleS, greenS: g.greenS, offsetS: g.offsetS, priority: g.priority }] : []
      })
      return [{ trip, line, stopDist, signals }]
    })
  }

  /** Every run on a service day (YYYYMMDD), simulated once and kept. */
  runsOn(date: string): Run[] {
    let runs = this.runsByDate.get(date)
    if (runs) return runs
    const day = parseGtfsDate(date)
    const dayStart = serviceDayStart(date, this.gtfs.timeZone)
    runs = []
    for (const p of this.trips) {
      if (!(this.gtfs.serviceDays.get(p.trip.serviceId) ?? []).includes(day!)) continue
      const first = p.trip.stopTimes[0].departureS
      const starts = p.trip.runStarts.length ? p.trip.runStarts : [first]
      for (const start of starts) {
        const shift = start - first
        const stops = p.trip.stopTimes.map((st, i) => ({ distM: p.stopDist[i], stopId: st.stopId, stopSequence: st.stopSequence, departureS: dayStart + st.departureS + shift }))
        const rand = seededRandom(hash(`${this.opts.seed}|${date}|${p.trip.tripId}|${start}`))
        runs.push({
          trip: p, date,
          startTime: p.trip.runStarts.length ? formatGtfsTime(start) : null,
          knots: simulateRun(stops, p.signals, rand, this.opts.priority),
        })
      }
    }
    if (this.runsByDate.size > 8) this.runsByDate.clear()
    this.runsByDate.set(date, runs)
    return runs
  }

  vehiclesAt(timeS: number): VehicleToEncode[] {
    const today = localDate(timeS, this.gtfs.timeZone)
    const yesterday = gtfsDate(parseGtfsDate(today)! - 1)
    const out: VehicleToEncode[] = []
    const gps = this.opts.gpsErrorM ?? 4
    for (const date of [yesterday, today]) {
      for (const run of this.runsOn(date)) {
        const at = positionAt(run.knots, timeS)
        if (!at) continue
        const key = `${run.trip.trip.tripId}-${date}${run.startTime ? `-${run.startTime}` : ''}`
        const noise = seededRandom(hash(`${this.opts.seed}|${key}|${timeS}`))
        const pt = pointAt(run.trip.line, at.distM)
        const dLat = ((noise() - 0.5) * 2 * gps) / 111_195
        const dLon = ((noise() - 0.5) * 2 * gps) / (111_195 * Math.cos((pt.lat * Math.PI) / 180))
        const stop = at.stop === null ? null : run.trip.trip.stopTimes[at.stop]
        out.push({
          entityId: key,
          tripId: run.trip.trip.tripId,
          routeId: run.trip.trip.routeId,
          startDate: date,
          ...(run.startTime ? { startTime: run.startTime } : {}),
          vehicleId: `LRT-${(hash(key) % 900) + 100}`,
          timeS,
          lat: pt.lat + dLat,
          lon: pt.lon + dLon,
          status: stop ? 1 : 2,
          ...(stop ? { stopId: stop.stopId, stopSequence: stop.stopSequence } : {}),
        })
      }
    }
    return out
  }

  feedAt(timeS: number): Uint8Array {
    return encodeVehicleFeed(timeS, this.vehiclesAt(timeS))
  }
}

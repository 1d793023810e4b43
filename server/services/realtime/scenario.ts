// The demo's buses as a realtime feed: every scheduled run of the chosen routes on a service day,
// simulated along its shape through the corridor's signals (bus-run.ts), read at any instant as a
// FULL_DATASET FeedMessage of VehiclePositions. The same seed, schedule and signals always give
// the same feed, so demo snapshots and tests are reproducible.
import { cumulativeDistanceM, projectOntoPolyline } from '../../../shared/gtfs/geo'
import { interpolateStopTimes } from '../../../shared/gtfs/interpolate'
import { gtfsDate, parseGtfsDate, weekdayIndex } from '../../../shared/gtfs/date'
import { formatGtfsTime } from '../../../shared/gtfs/time'
import { seededRandom } from './statistics'
import { buildShapeLine, pointAt, type ShapeLine } from './shape-line'
import { dayTypeOfIso, localDate, localParts, serviceDayStart } from './service-day'
import { planInForce, type PlanWindow } from '../../../shared/signals/timing-plan'
import { simulateRun, positionAt, type Knot, type PriorityRules, type RunSignal, type SignalTiming } from './bus-run'
import { encodeVehicleFeed, type TripUpdateToEncode, type VehicleToEncode } from './encode'
import type { ScenarioGtfs, ScenarioTrip } from './scenario-gtfs'

/** A timing plan: its window and day types, and the values the simulated bus needs. */
export interface ScenarioPlan extends PlanWindow {
  cycleS: number
  busGreenS: number
  /** Start of the bus-street green after the day's reference (local midnight), s. */
  offsetS: number
}

export interface ScenarioSignal {
  name: string
  lat: number
  lon: number
  plans: ScenarioPlan[]
  /** Whether priority runs here (when the scenario's priority is on). */
  priority: boolean
}

/** One plan all day, every day (for tests and simple scenarios). */
export function allDayPlan(cycleS: number, busGreenS: number, offsetS: number): ScenarioPlan {
  return { name: 'All day', dayTypes: ['weekday', 'saturday', 'sunday'], startTime: '00:00', endTime: '24:00', cycleS, busGreenS, offsetS }
}

export interface ScenarioOptions {
  seed: number
  signals: ScenarioSignal[]
  priority: PriorityRules
  /** GPS scatter of the reported positions, metres (about 3-5 m for bus AVL, common practice). */
  gpsErrorM?: number
  /** Also publish TripUpdates (the last stops served, with their times, and the next one). */
  tripUpdates?: boolean
  /** ...only in feeds whose time is a multiple of this many seconds (0: in every feed). */
  tripUpdateEveryS?: number
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
      // Times of the stops between timepoints, along the shape (the GTFS consumer's job).
      const arr = trip.stopTimes.map((st) => st.arrivalS)
      const dep = trip.stopTimes.map((st) => st.departureS)
      interpolateStopTimes(arr, dep, stopDist)
      trip.stopTimes.forEach((st, i) => { st.arrivalS = arr[i]; st.departureS = dep[i] })
      const signals = opts.signals.flatMap((g) => {
        const p = projectOntoPolyline(g.lat, g.lon, lat, lon, cum)
        return p.offsetM <= SIGNAL_MAX_OFFSET_M ? [{ distM: p.distM, timingAt: (t: number) => this.timingAt(g, t), priority: g.priority }] : []
      })
      return [{ trip, line, stopDist, signals }]
    })
  }

  /** The plan in force at a signal at an instant, by local time of day and day type. */
  private timingAt(g: ScenarioSignal, t: number): SignalTiming | null {
    const tz = this.gtfs.timeZone
    const p = localParts(t, tz)
    const date = localDate(t, tz)
    const iso = `${date.slice(0, 4)}-${date.slice(4, 6)}-${date.slice(6, 8)}`
    const plan = planInForce(g.plans, dayTypeOfIso(iso), p.hour * 60 + p.minute)
    if (!plan) return null
    return { cycleS: plan.cycleS, greenS: plan.busGreenS, greenStartS: serviceDayStart(date, tz) + plan.offsetS }
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
        const stops = p.trip.stopTimes.map((st, i) => ({
          distM: p.stopDist[i], stopId: st.stopId, stopSequence: st.stopSequence, departureS: dayStart + st.departureS + shift,
        }))
        // Draws depend on the trip and the weekday, not the date: the same run on a Tuesday before
        // and a Tuesday after a change meets the same crowds and queues, so the change shows.
        const rand = seededRandom(hash(`${this.opts.seed}|${weekdayIndex(day!)}|${p.trip.tripId}|${start}`))
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

  /** The runs on the street at an instant, with where each is. */
  private activeAt(timeS: number) {
    const today = localDate(timeS, this.gtfs.timeZone)
    const yesterday = gtfsDate(parseGtfsDate(today)! - 1)
    return [yesterday, today].flatMap((date) => this.runsOn(date).flatMap((run) => {
      const at = positionAt(run.knots, timeS)
      if (!at) return []
      const key = `${run.trip.trip.tripId}-${date}${run.startTime ? `-${run.startTime}` : ''}`
      return [{ run, at, key, date, vehicleId: `LRT-${(hash(key) % 900) + 100}` }]
    }))
  }

  vehiclesAt(timeS: number): VehicleToEncode[] {
    const gps = this.opts.gpsErrorM ?? 4
    return this.activeAt(timeS).map(({ run, at, key, date, vehicleId }) => {
      const noise = seededRandom(hash(`${this.opts.seed}|${key}|${timeS}`))
      const pt = pointAt(run.trip.line, at.distM)
      const dLat = ((noise() - 0.5) * 2 * gps) / 111_195
      const dLon = ((noise() - 0.5) * 2 * gps) / (111_195 * Math.cos((pt.lat * Math.PI) / 180))
      const stop = at.stop === null ? null : run.trip.trip.stopTimes[at.stop]
      return {
        entityId: key,
        tripId: run.trip.trip.tripId,
        routeId: run.trip.trip.routeId,
        startDate: date,
        ...(run.startTime ? { startTime: run.startTime } : {}),
        vehicleId,
        timeS,
        lat: pt.lat + dLat,
        lon: pt.lon + dLon,
        status: stop ? 1 : 2,
        ...(stop ? { stopId: stop.stopId, stopSequence: stop.stopSequence } : {}),
      }
    })
  }

  /**
   * What an AVL system reports: the arrival and departure times of the last two stops served
   * (the current one's arrival only, while the bus stands there) and the next stop's delay.
   */
  tripUpdatesAt(timeS: number): TripUpdateToEncode[] {
    const dayStarts = new Map<string, number>()
    return this.activeAt(timeS).map(({ run, key, date, vehicleId }) => {
      const served = new Map<number, { arrivalS: number; departureS: number | null }>()
      for (const k of run.knots) {
        if (k.stop === null || k.t > timeS) continue
        const e = served.get(k.stop)
        if (!e) served.set(k.stop, { arrivalS: k.t, departureS: null })
        else e.departureS = k.t
      }
      // The dwell's end is the departure; while the bus still stands at a stop only its arrival is known.
      const passed = [...served.entries()].sort((a, b) => a[0] - b[0]).slice(-2)
      const stops: TripUpdateToEncode['stops'] = passed.map(([i, e]) => ({
        stopSequence: run.trip.trip.stopTimes[i].stopSequence,
        arrivalS: Math.round(e.arrivalS),
        ...(e.departureS !== null ? { departureS: Math.round(e.departureS) } : {}),
      }))
      const lastIndex = passed.length ? passed[passed.length - 1][0] : 0
      const next = run.trip.trip.stopTimes[lastIndex + 1]
      if (next && passed.length) {
        let start = dayStarts.get(date)
        if (start === undefined) { start = serviceDayStart(date, this.gtfs.timeZone); dayStarts.set(date, start) }
        const last = passed[passed.length - 1][1]
        const scheduled = run.trip.trip.stopTimes[lastIndex]
        stops.push({ stopSequence: next.stopSequence, delayS: Math.round(last.arrivalS - (start + scheduled.arrivalS + this.shiftOf(run))) })
      }
      return { entityId: `tu-${key}`, tripId: run.trip.trip.tripId, startDate: date, ...(run.startTime ? { startTime: run.startTime } : {}), vehicleId, timeS, stops }
    })
  }

  private shiftOf(run: Run): number {
    if (!run.startTime) return 0
    const [h, m, s] = run.startTime.split(':').map(Number)
    return h * 3600 + m * 60 + s - run.trip.trip.stopTimes[0].departureS
  }

  /** The feed at an instant; trip updates at most every `tripUpdateEveryS` (an AVL system refreshes them less often). */
  feedAt(timeS: number): Uint8Array {
    const every = this.opts.tripUpdateEveryS ?? 0
    const withUpdates = this.opts.tripUpdates && (every <= 0 || timeS % every === 0)
    return encodeVehicleFeed(timeS, this.vehiclesAt(timeS), withUpdates ? this.tripUpdatesAt(timeS) : [])
  }
}

// From stored observations to observed stop and segment times of each trip over a corridor.
//
// Every trip is placed on the corridor's representative shape: positions are projected onto it,
// STOPPED_AT readings and TripUpdate stop times pin the bus to the corridor stop's distance
// (trajectory.ts). The time the bus reaches a distance is interpolated between the points around
// it. Boundaries use the arrival there, so a segment includes a dwell at a stop inside it and the
// times of consecutive segments add up. The corridor run is timed from leaving its first stop to
// reaching its last one.
//
// The segment of an intersection runs from the upstream end of the model's approach to its
// downstream end (the lengths the proposals' evaluation gives the model), cut at the midpoint to
// a neighbouring intersection so that no delay is counted twice: observed and modelled delay
// then cover the same stretch of street.
import { inWindow } from '../../../shared/signals/time-of-day'
import { minuteOfDay } from '../../../shared/corridors/schedule'
import { buildShapeLine, type ShapeLine } from './shape-line'
import { arrivalAt, buildTrajectory, departureAt, dwellAt, type TrajectoryPoint } from './trajectory'
import { dayTypeOfIso, serviceDayStart } from './service-day'
import type { CorridorApproachInfo, CorridorInfo } from './corridor-data'
import { MODEL_ASSUMPTIONS } from '../../../shared/proposals/model-input'
import type { ObservedTripDto, SegmentDefinitionDto } from '../../../shared/schemas/realtime'

/** The modelled stretch of an approach, as shared/proposals/model-input.ts lays it out. */
export function modelledLengths(a: CorridorApproachInfo, stopDistanceM: number | null): { upstreamM: number; downstreamM: number } {
  const A = MODEL_ASSUMPTIONS
  const stop = stopDistanceM ?? A.defaultStopDistanceM
  return {
    upstreamM: Math.max(A.minApproachLengthM, a.checkInDistanceM + 50, a.stopRelation === 'near-side' ? stop + 50 : 0),
    downstreamM: Math.max(A.downstreamLengthM, a.stopRelation === 'far-side' ? stop + 50 : 0),
  }
}

export interface PositionRow {
  tripId: string
  serviceDate: string
  startTime: string | null
  timeS: number
  lat: number
  lon: number
  status: number
  stopId: string | null
  stopSequence: number | null
}

export interface StopEventRow {
  tripId: string
  serviceDate: string
  stopSequence: number
  stopId: string
  arrivalS: number | null
  departureS: number | null
}

/** A scheduled stop time of a trip at a corridor stop (GTFS seconds of the service day). */
export interface ScheduledPass {
  tripId: string
  stopSequence: number
  stopId: string
  arrivalS: number
  departureS: number
}

export function segmentsOf(c: Pick<CorridorInfo, 'approaches' | 'stops'>, lengthM: number): SegmentDefinitionDto[] {
  const xs = c.approaches.map((a) => a.distanceM)
  return c.approaches.map((a, i) => {
    const prev = i > 0 ? (xs[i - 1] + a.distanceM) / 2 : 0
    const next = i < xs.length - 1 ? (a.distanceM + xs[i + 1]) / 2 : lengthM
    const stop = a.stopId ? c.stops.find((s) => s.stopId === a.stopId) : undefined
    const { upstreamM, downstreamM } = modelledLengths(a, stop ? Math.abs(stop.distanceM - a.distanceM) : null)
    return {
      approachId: a.id,
      intersectionId: a.intersectionId,
      intersectionName: a.intersectionName,
      stopLineM: a.distanceM,
      fromM: Math.max(prev, a.distanceM - upstreamM, 0),
      toM: Math.min(next, a.distanceM + downstreamM, lengthM),
    }
  })
}

export interface CorridorDerivation {
  line: ShapeLine
  segments: SegmentDefinitionDto[]
  runFromM: number
  runToM: number
  trips: ObservedTripDto[]
}

/** Scheduled (GTFS seconds) time at a distance: between the scheduled stops around it, in proportion to distance. */
function scheduledAt(passes: { distM: number; arrivalS: number; departureS: number }[], x: number): number | null {
  for (let k = 0; k < passes.length; k++) {
    const b = passes[k]
    if (b.distM === x) return b.arrivalS
    if (b.distM > x) {
      if (k === 0) return null
      const a = passes[k - 1]
      return a.departureS + ((x - a.distM) / (b.distM - a.distM)) * (b.arrivalS - a.departureS)
    }
  }
  return null
}

const groupKey = (tripId: string, date: string) => `${date}|${tripId}`

export function deriveCorridorTrips(
  c: CorridorInfo,
  rows: { positions: PositionRow[]; stopEvents: StopEventRow[]; schedule: ScheduledPass[] },
  shiftFor: (tripId: string, startTime: string | null) => number = () => 0,
): CorridorDerivation {
  const line = buildShapeLine(c.shape)
  const segments = segmentsOf(c, line.lengthM)
  const stopDist = new Map<string, number>()
  for (const s of c.stops) if (!stopDist.has(s.stopId)) stopDist.set(s.stopId, s.distanceM)
  const runFromM = c.stops.length ? c.stops[0].distanceM : 0
  const runToM = c.stops.length ? c.stops[c.stops.length - 1].distanceM : line.lengthM

  const scheduleByTrip = new Map<string, ScheduledPass[]>()
  for (const s of rows.schedule) {
    const list = scheduleByTrip.get(s.tripId) ?? []
    list.push(s)
    scheduleByTrip.set(s.tripId, list)
  }
  const groups = new Map<string, { tripId: string; date: string; positions: PositionRow[]; events: StopEventRow[] }>()
  const group = (tripId: string, date: string) => {
    const k = groupKey(tripId, date)
    let g = groups.get(k)
    if (!g) { g = { tripId, date, positions: [], events: [] }; groups.set(k, g) }
    return g
  }
  for (const p of rows.positions) group(p.tripId, p.serviceDate).positions.push(p)
  for (const e of rows.stopEvents) group(e.tripId, e.serviceDate).events.push(e)

  const periodAt = (gtfsS: number) => c.periods.find((p) => inWindow(p, minuteOfDay(gtfsS)))?.id ?? null
  const trips: ObservedTripDto[] = []
  for (const g of [...groups.values()].sort((a, b) => (a.date + a.tripId < b.date + b.tripId ? -1 : 1))) {
    const startTime = g.positions.find((p) => p.startTime)?.startTime ?? null
    const shift = shiftFor(g.tripId, startTime)
    const dayStart = serviceDayStart(g.date.replaceAll('-', ''), c.timeZone) + shift
    const schedule = scheduleByTrip.get(g.tripId) ?? []
    const seqToStop = new Map(schedule.map((s) => [s.stopSequence, s.stopId]))
    const distOfReported = (stopId: string | null, seq: number | null) => {
      const id = stopId ?? (seq !== null ? seqToStop.get(seq) ?? null : null)
      return id === null ? null : stopDist.get(id) ?? null
    }
    const positions = g.positions.map((p) => ({
      timeS: p.timeS, lat: p.lat, lon: p.lon,
      stoppedAtDistM: p.status === 1 ? distOfReported(p.stopId, p.stopSequence) : null,
    }))
    const events = g.events.flatMap((e) => {
      const d = stopDist.get(e.stopId)
      return d === undefined ? [] : [{ distM: d, arrivalS: e.arrivalS, departureS: e.departureS }]
    })
    const { points, offRoute } = buildTrajectory(line, positions, events)
    const passes = schedule.flatMap((s) => {
      const d = stopDist.get(s.stopId)
      return d === undefined ? [] : [{ distM: d, arrivalS: s.arrivalS, departureS: s.departureS, stopId: s.stopId }]
    }).sort((a, b) => a.distM - b.distM)
    trips.push(describeTrip(g.tripId, g.date, dayStart, points, passes, c, segments, runFromM, runToM, periodAt, {
      positions: g.positions.length, stopEvents: g.events.length, offRoute,
    }))
  }
  return { line, segments, runFromM, runToM, trips }
}

function describeTrip(
  tripId: string, date: string, dayStart: number, traj: TrajectoryPoint[],
  passes: { distM: number; arrivalS: number; departureS: number; stopId: string }[],
  c: CorridorInfo, segments: SegmentDefinitionDto[], runFromM: number, runToM: number,
  periodAt: (gtfsS: number) => string | null, counts: { positions: number; stopEvents: number; offRoute: number },
): ObservedTripDto {
  const round = (v: number | null) => (v === null ? null : Math.round(v * 10) / 10)
  const stops = c.stops.map((s) => {
    const arrival = arrivalAt(traj, s.distanceM)
    const departure = arrival === null ? null : departureAt(traj, s.distanceM)
    const pass = passes.find((p) => p.stopId === s.stopId)
    const scheduled = pass ? dayStart + pass.arrivalS : null
    return {
      stopId: s.stopId, distanceM: s.distanceM, arrivalS: round(arrival), departureS: round(departure), scheduledS: scheduled,
      latenessS: arrival !== null && scheduled !== null ? round(arrival - scheduled) : null,
    }
  })
  const segs = segments.flatMap((seg) => {
    const enter = arrivalAt(traj, seg.fromM)
    const exit = arrivalAt(traj, seg.toM)
    if (enter === null || exit === null) return []
    const dwells = c.stops.filter((s) => s.distanceM >= seg.fromM && s.distanceM < seg.toM).map((s) => dwellAt(traj, s.distanceM))
    const known = dwells.filter((d): d is number => d !== null)
    const cross = arrivalAt(traj, seg.stopLineM)
    const sched = scheduledAt(passes, seg.stopLineM)
    return [{
      approachId: seg.approachId,
      enterS: round(enter)!,
      exitS: round(exit)!,
      travelS: round(exit - enter)!,
      dwellS: known.length ? round(known.reduce((a, b) => a + b, 0)) : null,
      periodId: periodAt((cross ?? enter) - dayStart),
      latenessS: cross !== null && sched !== null ? round(cross - (dayStart + sched)) : null,
    }]
  })
  const start = departureAt(traj, runFromM)
  const end = arrivalAt(traj, runToM)
  const startOk = start !== null && arrivalAt(traj, runFromM) !== null
  return {
    tripId,
    serviceDate: date,
    dayType: dayTypeOfIso(date),
    periodId: startOk ? periodAt(start - dayStart) : null,
    startS: startOk ? round(start) : null,
    runTimeS: startOk && end !== null ? round(end - start) : null,
    stops,
    segments: segs,
    ...counts,
  }
}

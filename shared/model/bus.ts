/**
 * A bus through the traffic field of one approach. It runs at the local traffic speed capped by
 * its own cruise speed, stands while the queue around it stands, and starts again when the
 * discharge wave reaches it. The kinematic-wave field changes speed instantly, so the bus's own
 * braking and acceleration are charged as a time penalty per stop:
 *  - at a bus stop, v/(2a) + v/(2d) (the usual "time lost per stop" of transit capacity
 *    practice) plus the dwell, in the free run as well, so the delay against the free run is the
 *    signal's doing;
 *  - at the queue or a red, where the wave model has the bus wait tau: braking happens within
 *    the wait when tau >= v/(2d), so the stop costs v/(2a) more; a shorter wait is a slow-down,
 *    not a stop, and costs tau d/a more (the two agree at tau = v/(2d), and a bus that only
 *    touches the back of a queue as it moves off loses nothing).
 * The bus does not change the traffic (one vehicle in the stream, stopping out of the running
 * lane at its stop).
 *
 * Positions: x = 0 at the stop line, upstream negative; the approach runs from -lengthM to
 * +downstreamLengthM.
 *
 * Check-in: the priority request goes out when the bus passes the check-in point. If a near-side
 * stop lies between that point and the stop line, the dwell there is not known in advance, so
 * the request goes out when the doors close and the bus leaves the stop.
 */
import type { ExactApproach, QueueField } from './cumulative-counts'

export interface BusStopAt {
  /** distance from the stop line, m (upstream for near-side, downstream for far-side) */
  distanceM: number
  dwellS: number
}

export interface BusSetup {
  /** running speed, m/s: cruise speed capped by the free traffic speed */
  speed: number
  lengthM: number
  downstreamLengthM: number
  nearSide: BusStopAt | null
  farSide: BusStopAt | null
  checkInDistanceM: number
  accelMps2: number
  decelMps2: number
  /** v/(2a) + v/(2d), s: what a bus stop costs beyond its dwell */
  stopPenaltyS: number
}

export interface BusRun {
  startS: number
  /** when the priority request goes out */
  requestS: number
  /** when the bus passes the stop line */
  crossS: number
  /** when it leaves the downstream end */
  exitS: number
  /** full stops from motion caused by the signal or its queue */
  stops: number
  /** whether the signal or its queue made the bus stand or slow down at all */
  held: boolean
  /** (t, x) pairs of the trajectory, when asked for */
  points: number[] | null
}

export function stopPenaltyS(speedMps: number, accelMps2: number, decelMps2: number): number {
  return speedMps / (2 * accelMps2) + speedMps / (2 * decelMps2)
}

/** Whether a wait of the wave model is a full stop (long enough to brake to a stand). */
export function isFullStop(bus: BusSetup, waitS: number): boolean {
  return waitS >= bus.speed / (2 * bus.decelMps2)
}

/** Extra time a wait of waitS at a queue or red costs a bus from cruise (see the header). */
export function queueStopPenaltyS(bus: BusSetup, waitS: number): number {
  if (waitS <= 0) return 0
  return isFullStop(bus, waitS) ? bus.speed / (2 * bus.accelMps2) : (waitS * bus.decelMps2) / bus.accelMps2
}

/** Free run from the upstream end to the stop line, bus stop included. */
export function freeTimeToLineS(bus: BusSetup): number {
  return bus.lengthM / bus.speed + (bus.nearSide ? bus.nearSide.dwellS + bus.stopPenaltyS : 0)
}

/** Free run over the whole approach, bus stops included. */
export function freeRunS(bus: BusSetup): number {
  return freeTimeToLineS(bus) + bus.downstreamLengthM / bus.speed + (bus.farSide ? bus.farSide.dwellS + bus.stopPenaltyS : 0)
}

/** Whether the request waits for the doors to close at a near-side stop. */
export function requestAtDoorClose(bus: BusSetup): boolean {
  return bus.nearSide !== null && bus.nearSide.distanceM <= bus.checkInDistanceM
}

const EPS = 1e-9

/**
 * The bus through the exact triangular field: between stops it runs at its speed; it stops where
 * its path enters a red's queue polygon and leaves when the discharge wave reaches it.
 */
export function runBusExact(ex: ExactApproach, field: QueueField, bus: BusSetup, startS: number, record: boolean): BusRun {
  const { redStart, redEnd } = field.plan
  const tStar = field.tStar
  const nRed = redStart.length
  const v = bus.speed
  const w = ex.w
  const u = ex.u
  const checkIn = bus.checkInDistanceM
  const doorClose = requestAtDoorClose(bus)
  const points = record ? [startS, -bus.lengthM] : null
  let t = startS
  let d = bus.lengthM
  let requestS = doorClose ? NaN : d <= checkIn ? t : NaN
  let stops = 0
  let held = false
  let moving = true
  // first red whose polygon can still lie ahead of the bus
  let ptr = 0
  while (ptr < nRed && redEnd[ptr] + d / w <= t) ptr++

  // legs: to the near-side stop (if any), then to the line; written as one loop (no closures:
  // this runs for every arrival phase of every approach)
  const legs = bus.nearSide ? 2 : 1
  for (let leg = 0; leg < legs; leg++) {
    const dTarget = leg === 0 && bus.nearSide ? bus.nearSide.distanceM : 0
    for (;;) {
      const tauMax = (d - dTarget) / v
      let entry = -1
      let te = 0
      for (let i = ptr; i < nRed; i++) {
        const r0 = redStart[i]
        if (r0 + dTarget / w > t + tauMax) break
        const tau3 = (redEnd[i] + d / w - t) / (1 + v / w)
        if (tau3 <= 0) {
          if (i === ptr) ptr++
          continue
        }
        const tau1 = (r0 + d / w - t) / (1 + v / w)
        const tau2 = (tStar[i] + d / u - t) / (1 + v / u)
        let e = tau1 > tau2 ? tau1 : tau2
        if (e < 0) e = 0
        if (e < tau3 && e < tauMax - EPS) {
          entry = i
          te = e
          break
        }
      }
      const dNext = entry < 0 ? dTarget : d - v * te
      if (!doorClose && requestS !== requestS && d >= checkIn && dNext <= checkIn) requestS = t + (d - checkIn) / v
      if (entry < 0) {
        t += tauMax
        d = dTarget
        if (points) points.push(t, -d)
        break
      }
      t += te
      d = dNext
      if (points) points.push(t, -d)
      const restart = redEnd[entry] + d / w
      const wait = restart - t
      if (wait > EPS) held = true
      t = restart
      if (points) points.push(t, -d)
      // a bus held the moment its doors close does not brake again
      if (moving || te > 0) {
        if (isFullStop(bus, wait)) stops++
        t += queueStopPenaltyS(bus, wait)
        if (points) points.push(t, -d)
      }
      moving = true
      ptr = entry + 1
    }
    if (leg === 0 && bus.nearSide) {
      t += bus.nearSide.dwellS + bus.stopPenaltyS
      if (points) points.push(t, -d)
      moving = false
      if (doorClose) requestS = t
    }
  }
  const crossS = t
  if (bus.farSide) {
    t += bus.farSide.distanceM / v
    if (points) points.push(t, bus.farSide.distanceM)
    t += bus.farSide.dwellS + bus.stopPenaltyS
    if (points) points.push(t, bus.farSide.distanceM)
    t += (bus.downstreamLengthM - bus.farSide.distanceM) / v
  } else {
    t += bus.downstreamLengthM / v
  }
  if (points) points.push(t, bus.downstreamLengthM)
  return { startS, requestS, crossS, exitS: t, stops, held, points }
}

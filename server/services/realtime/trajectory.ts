// One trip's observed trajectory: (time, distance along the shape) points, non-decreasing in both,
// built from vehicle positions and stop events, and the times it reached given distances.
// Stop events (TripUpdate times, STOPPED_AT readings) pin the bus to the stop's distance; positions
// fill in between them. Between two points the bus is taken to move at a constant speed, which
// is why gaps longer than maxGapS give no crossing time rather than a guess.
import { project, type ShapeLine } from './shape-line'

export interface TrajectoryPoint {
  timeS: number
  distM: number
  /** True when the point is a stop event (arrival/departure or STOPPED_AT), not a projected position. */
  atStop: boolean
}

export interface PositionInput {
  timeS: number
  lat: number
  lon: number
  /** Distance of the stop the vehicle reports STOPPED_AT, when it does and the stop is known. */
  stoppedAtDistM: number | null
}

export interface StopEventInput {
  distM: number
  arrivalS: number | null
  departureS: number | null
}

export interface TrajectoryOptions {
  /** Positions farther than this from the shape are off-route and left out. */
  maxOffsetM: number
  /** A bus covers at most this speed between readings (bounds the projection search). */
  maxSpeedMps: number
  /** No crossing time is interpolated across a gap longer than this. */
  maxGapS: number
}

export const DEFAULT_TRAJECTORY_OPTIONS: TrajectoryOptions = { maxOffsetM: 100, maxSpeedMps: 30, maxGapS: 300 }

export interface Trajectory {
  points: TrajectoryPoint[]
  offRoute: number
}

export function buildTrajectory(
  line: ShapeLine,
  positions: PositionInput[],
  stopEvents: StopEventInput[],
  opts: TrajectoryOptions = DEFAULT_TRAJECTORY_OPTIONS,
): Trajectory {
  const fixed: TrajectoryPoint[] = []
  for (const e of stopEvents) {
    if (e.arrivalS !== null) fixed.push({ timeS: e.arrivalS, distM: e.distM, atStop: true })
    if (e.departureS !== null) fixed.push({ timeS: e.departureS, distM: e.distM, atStop: true })
  }
  fixed.sort((a, b) => a.timeS - b.timeS || a.distM - b.distM)

  const sorted = [...positions].sort((a, b) => a.timeS - b.timeS)
  const projected: TrajectoryPoint[] = []
  let offRoute = 0
  let lastDist = 0
  let lastTime: number | null = null
  for (const p of sorted) {
    if (lastTime !== null && p.timeS === lastTime) continue // the same reading repeated by later snapshots
    if (p.stoppedAtDistM !== null) {
      projected.push({ timeS: p.timeS, distM: p.stoppedAtDistM, atStop: true })
      lastDist = Math.max(lastDist, p.stoppedAtDistM)
      lastTime = p.timeS
      continue
    }
    const reach = lastTime === null ? Infinity : lastDist + opts.maxSpeedMps * (p.timeS - lastTime) + opts.maxOffsetM
    const pr = project(line, p, lastTime === null ? 0 : Math.max(0, lastDist - opts.maxOffsetM), reach)
    if (pr.offsetM > opts.maxOffsetM) { offRoute++; continue }
    projected.push({ timeS: p.timeS, distM: pr.distM, atStop: false })
    lastDist = Math.max(lastDist, pr.distM)
    lastTime = p.timeS
  }

  // Merge: positions are clamped between the stop events around them in time, then the whole
  // sequence is made non-decreasing (GPS jitter must not move a bus backwards).
  const merged: TrajectoryPoint[] = []
  let f = 0
  for (const p of projected) {
    while (f < fixed.length && fixed[f].timeS <= p.timeS) merged.push(fixed[f++])
    if (merged.length && merged[merged.length - 1].timeS === p.timeS) continue
    const next = f < fixed.length ? fixed[f].distM : Infinity
    merged.push({ ...p, distM: Math.min(p.distM, next) })
  }
  while (f < fixed.length) merged.push(fixed[f++])
  let maxDist = -Infinity
  const points = merged.map((p) => {
    maxDist = Math.max(maxDist, p.distM)
    return { ...p, distM: maxDist }
  })
  return { points, offRoute }
}

/**
 * A bus first seen this close past a point, or seen this close to a stop after reaching it, is
 * taken to be at it: a bus waiting at a terminal or a stop reads a few metres off by GPS.
 */
export const AT_POINT_TOLERANCE_M = 15

/** First time the trajectory reaches distM (the arrival there), or null if unobserved. */
export function arrivalAt(traj: TrajectoryPoint[], distM: number, maxGapS = DEFAULT_TRAJECTORY_OPTIONS.maxGapS): number | null {
  for (let k = 0; k < traj.length; k++) {
    const p = traj[k]
    if (p.distM < distM) continue
    if (p.distM === distM) return p.timeS
    if (k === 0) return p.distM - distM <= AT_POINT_TOLERANCE_M ? p.timeS : null
    const q = traj[k - 1]
    if (p.timeS - q.timeS > maxGapS) return null
    return q.timeS + ((distM - q.distM) / (p.distM - q.distM)) * (p.timeS - q.timeS)
  }
  return null
}

/** Last time the trajectory is at distM (the departure from a stop there), or null if unobserved. */
export function departureAt(traj: TrajectoryPoint[], distM: number, maxGapS = DEFAULT_TRAJECTORY_OPTIONS.maxGapS): number | null {
  const arrival = arrivalAt(traj, distM, maxGapS)
  if (arrival === null) return null
  let last = arrival
  for (const p of traj) {
    if (p.distM > distM + AT_POINT_TOLERANCE_M) break
    if (p.timeS > last && p.distM >= distM) last = p.timeS
  }
  return last
}

/** Observed dwell at a stop: the time the trajectory stays at its distance, when stop events show it. */
export function dwellAt(traj: TrajectoryPoint[], distM: number): number | null {
  const at = traj.filter((p) => p.distM === distM && p.atStop)
  if (at.length < 2) return null
  return at[at.length - 1].timeS - at[0].timeS
}

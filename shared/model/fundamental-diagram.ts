/**
 * Fundamental diagrams q(k) of the LWR conservation law k_t + q(k)_x = 0
 * (Lighthill & Whitham 1955; Richards 1956).
 *
 *   Greenshields (1935): q = vf k (1 - k/kj), capacity vf kj / 4 at kj / 2, c(k) = vf (1 - 2k/kj).
 *   Triangular (Newell 1993; Daganzo 1994): q = min(vf k, w (kj - k)), capacity vf w kj / (vf + w).
 *
 * SI throughout: k in veh/m, q in veh/s, speeds in m/s. A diagram value describes a whole road
 * section; `forLanes` scales a per-lane diagram (jam density and capacity grow with the lanes,
 * speeds do not).
 */
import { kmhToMps, perHourToPerS, perKmToPerM } from './si'

export interface TriangularDiagram {
  kind: 'triangular'
  /** free-flow speed, m/s */
  vf: number
  /** backward (congested) wave speed, m/s, positive */
  w: number
  /** jam density, veh/m */
  kj: number
}

export interface GreenshieldsDiagram {
  kind: 'greenshields'
  vf: number
  kj: number
}

export type Diagram = TriangularDiagram | GreenshieldsDiagram

export function criticalDensity(d: Diagram): number {
  return d.kind === 'triangular' ? (d.w * d.kj) / (d.vf + d.w) : d.kj / 2
}

export function capacity(d: Diagram): number {
  return d.kind === 'triangular' ? (d.vf * d.w * d.kj) / (d.vf + d.w) : (d.vf * d.kj) / 4
}

export function flux(d: Diagram, k: number): number {
  if (d.kind === 'triangular') return Math.max(0, Math.min(d.vf * k, d.w * (d.kj - k)))
  return Math.max(0, d.vf * k * (1 - k / d.kj))
}

/** Space-mean speed q/k; the free-flow speed at k = 0. */
export function speed(d: Diagram, k: number): number {
  if (k <= 0) return d.vf
  if (k >= d.kj) return 0
  return flux(d, k) / k
}

/**
 * Characteristic speed q'(k). The triangular diagram has a kink at the critical density; there the
 * free-branch value vf is returned (a state at capacity discharged from a queue travels with the
 * free-flow vehicles).
 */
export function waveSpeed(d: Diagram, k: number): number {
  if (d.kind === 'triangular') return k <= criticalDensity(d) ? d.vf : -d.w
  return d.vf * (1 - (2 * k) / d.kj)
}

/** Inverse of q' inside a rarefaction fan: the density whose characteristic speed is c. */
export function densityAtWaveSpeed(d: Diagram, c: number): number {
  if (d.kind === 'triangular') {
    if (c >= d.vf) return 0
    if (c <= -d.w) return d.kj
    return criticalDensity(d)
  }
  return Math.min(d.kj, Math.max(0, (d.kj / 2) * (1 - c / d.vf)))
}

/** Largest |q'(k)|, which bounds the time step (CFL). */
export function maxWaveSpeed(d: Diagram): number {
  return d.kind === 'triangular' ? Math.max(d.vf, d.w) : d.vf
}

/** Sending function: the flow a state can send downstream, q(min(k, kc)). */
export function demand(d: Diagram, k: number): number {
  return flux(d, Math.min(k, criticalDensity(d)))
}

/** Receiving function: the flow a state can accept from upstream, q(max(k, kc)). */
export function supply(d: Diagram, k: number): number {
  return flux(d, Math.max(k, criticalDensity(d)))
}

/** Density on the free branch that carries flow q (q below capacity). */
export function freeDensity(d: Diagram, q: number): number {
  if (q >= capacity(d)) return criticalDensity(d)
  if (d.kind === 'triangular') return q / d.vf
  // smaller root of vf k (1 - k/kj) = q
  return (d.kj / 2) * (1 - Math.sqrt(1 - (4 * q) / (d.vf * d.kj)))
}

/** Density on the congested branch that carries flow q. */
export function congestedDensity(d: Diagram, q: number): number {
  if (q >= capacity(d)) return criticalDensity(d)
  if (d.kind === 'triangular') return d.kj - q / d.w
  return (d.kj / 2) * (1 + Math.sqrt(1 - (4 * q) / (d.vf * d.kj)))
}

export function forLanes<D extends Diagram>(perLane: D, lanes: number): D {
  return { ...perLane, kj: perLane.kj * lanes }
}

// Calibration helpers, from the quantities practitioners measure (per lane, practical units).

export interface TriangularWaveInput {
  freeFlowSpeedKmh: number
  backwardWaveSpeedKmh: number
  jamDensityVehPerKmPerLane: number
}

export function triangularFromWaveSpeed(p: TriangularWaveInput, lanes = 1): TriangularDiagram {
  return forLanes(
    { kind: 'triangular', vf: kmhToMps(p.freeFlowSpeedKmh), w: kmhToMps(p.backwardWaveSpeedKmh), kj: perKmToPerM(p.jamDensityVehPerKmPerLane) },
    lanes,
  )
}

export interface TriangularSaturationInput {
  saturationFlowVehPerHourPerLane: number
  freeFlowSpeedKmh: number
  jamDensityVehPerKmPerLane: number
}

/**
 * The triangle through capacity s, free speed vf and jam density kj: w = s vf / (vf kj - s).
 * Requires s < vf kj (the capacity point must lie under the free-flow line).
 */
export function triangularFromSaturationFlow(p: TriangularSaturationInput, lanes = 1): TriangularDiagram {
  const s = perHourToPerS(p.saturationFlowVehPerHourPerLane)
  const vf = kmhToMps(p.freeFlowSpeedKmh)
  const kj = perKmToPerM(p.jamDensityVehPerKmPerLane)
  if (s >= vf * kj) throw new RangeError('saturation flow must be below free speed x jam density')
  return forLanes({ kind: 'triangular', vf, w: (s * vf) / (vf * kj - s), kj }, lanes)
}

export interface GreenshieldsInput {
  freeFlowSpeedKmh: number
  jamDensityVehPerKmPerLane: number
}

export function greenshields(p: GreenshieldsInput, lanes = 1): GreenshieldsDiagram {
  return forLanes({ kind: 'greenshields', vf: kmhToMps(p.freeFlowSpeedKmh), kj: perKmToPerM(p.jamDensityVehPerKmPerLane) }, lanes)
}

/** Greenshields through a measured capacity and free speed: kj = 4 q_max / vf. */
export function greenshieldsFromCapacity(p: { capacityVehPerHourPerLane: number; freeFlowSpeedKmh: number }, lanes = 1): GreenshieldsDiagram {
  const vf = kmhToMps(p.freeFlowSpeedKmh)
  return forLanes({ kind: 'greenshields', vf, kj: (4 * perHourToPerS(p.capacityVehPerHourPerLane)) / vf }, lanes)
}

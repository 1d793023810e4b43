/**
 * Godunov finite-volume scheme for k_t + q(k)_x = 0 with a concave q (Godunov 1959):
 *
 *   k_i^{n+1} = k_i^n + dt/dx (F_{i-1/2} - F_{i+1/2}),   F_{i+1/2} = min(D(k_i), S(k_{i+1})),
 *
 * where D and S are the sending and receiving functions; for a concave diagram this minimum is
 * the flux of the exact Riemann solution at x/t = 0. With the triangular diagram and
 * dt = dx / vf the update is Daganzo's (1994) cell transmission model
 * y_i = min{n_{i-1}, Q, (w/vf)(N - n_i)} with n = k dx, Q = q_max dt, N = kj dx.
 * Stable for max|q'| dt / dx <= 1 (CFL).
 *
 * Interfaces are numbered 0..n: interface 0 is the upstream boundary, n the downstream one,
 * interface i lies between cells i-1 and i. One interior interface may carry a signal whose
 * open share in the step (0..1) scales its flux.
 */
import { type Diagram, capacity, criticalDensity, demand, maxWaveSpeed, supply } from './fundamental-diagram'

export function godunovFlux(d: Diagram, kLeft: number, kRight: number): number {
  return Math.min(demand(d, kLeft), supply(d, kRight))
}

export function stableDt(d: Diagram, dx: number, cfl = 0.9): number {
  return (cfl * dx) / maxWaveSpeed(d)
}

export interface StepBoundary {
  /** flow the upstream ghost state sends, veh/s (arrivals; the first cell's supply caps it) */
  inflowDemand: number
  /** flow the downstream ghost state accepts, veh/s (capacity for a free exit) */
  outflowSupply: number
  /** interface index of the signal, or -1 */
  signalInterface: number
  /** share of the step the signal is open (0 red, 1 green) */
  signalOpen: number
}

/** Fluxes through the boundaries and the signal in the last step, veh/s. */
export interface StepFlows {
  inflow: number
  outflow: number
  signal: number
}

export function newStepFlows(): StepFlows {
  return { inflow: 0, outflow: 0, signal: 0 }
}

export function freeBoundary(d: Diagram, inflowDemand: number): StepBoundary {
  return { inflowDemand, outflowSupply: capacity(d), signalInterface: -1, signalOpen: 1 }
}

/**
 * One Godunov step in place. The loop is written out per diagram so that it stays a tight loop
 * over a typed array (this is the inner loop of every time-space diagram).
 */
export function step(d: Diagram, k: Float64Array, dt: number, dx: number, bc: StepBoundary, flows: StepFlows): void {
  const n = k.length
  const r = dt / dx
  const kc = criticalDensity(d)
  const qmax = capacity(d)
  const vf = d.vf
  const kj = d.kj
  const sig = bc.signalInterface
  const open = bc.signalOpen
  // interface 0
  let k0 = k[0]
  let fLeft: number
  if (d.kind === 'triangular') {
    const w = d.w
    let s0 = w * (kj - k0)
    if (s0 > qmax) s0 = qmax
    fLeft = bc.inflowDemand < s0 ? bc.inflowDemand : s0
    if (sig === 0) fLeft *= open
    flows.inflow = fLeft
    for (let i = 0; i < n - 1; i++) {
      const k1 = k[i + 1]
      let dem = vf * k0
      if (dem > qmax) dem = qmax
      let sup = w * (kj - k1)
      if (sup > qmax) sup = qmax
      let f = dem < sup ? dem : sup
      if (i + 1 === sig) { f *= open; flows.signal = f }
      k[i] = k0 + r * (fLeft - f)
      fLeft = f
      k0 = k1
    }
    let dem = vf * k0
    if (dem > qmax) dem = qmax
    let f = dem < bc.outflowSupply ? dem : bc.outflowSupply
    if (sig === n) { f *= open; flows.signal = f }
    k[n - 1] = k0 + r * (fLeft - f)
    flows.outflow = f
    return
  }
  const a = vf / kj
  const s0 = k0 > kc ? vf * k0 - a * k0 * k0 : qmax
  fLeft = bc.inflowDemand < s0 ? bc.inflowDemand : s0
  if (sig === 0) fLeft *= open
  flows.inflow = fLeft
  for (let i = 0; i < n - 1; i++) {
    const k1 = k[i + 1]
    const dem = k0 < kc ? vf * k0 - a * k0 * k0 : qmax
    const sup = k1 > kc ? vf * k1 - a * k1 * k1 : qmax
    let f = dem < sup ? dem : sup
    if (i + 1 === sig) { f *= open; flows.signal = f }
    k[i] = k0 + r * (fLeft - f)
    fLeft = f
    k0 = k1
  }
  const dem = k0 < kc ? vf * k0 - a * k0 * k0 : qmax
  let f = dem < bc.outflowSupply ? dem : bc.outflowSupply
  if (sig === n) { f *= open; flows.signal = f }
  k[n - 1] = k0 + r * (fLeft - f)
  flows.outflow = f
}

/** Cell transmission view of a triangular diagram at dt: cell length, cell capacity N, flow Q. */
export function cellTransmission(d: Diagram, dt: number): { dx: number; N: number; Q: number; wOverVf: number } {
  if (d.kind !== 'triangular') throw new RangeError('the cell transmission model uses the triangular diagram')
  const dx = d.vf * dt
  return { dx, N: d.kj * dx, Q: capacity(d) * dt, wOverVf: d.w / d.vf }
}

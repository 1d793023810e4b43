import { describe, expect, it } from 'vitest'
import {
  type Diagram, capacity, demand, fixedTimePlan, freeDensity, greenshields, newStepFlows, openShares, solveRiemann,
  stableDt, step, supply, triangularFromWaveSpeed,
} from '../../../shared/model'

const tri = triangularFromWaveSpeed({ freeFlowSpeedKmh: 60, backwardWaveSpeedKmh: 20, jamDensityVehPerKmPerLane: 120 })
const gs = greenshields({ freeFlowSpeedKmh: 60, jamDensityVehPerKmPerLane: 120 })

/** L1 error against the exact Riemann solution at time T on n cells over 1 km. */
function riemannError(d: Diagram, kL: number, kR: number, n: number, T = 15): number {
  const L = 1000
  const dx = L / n
  const k = new Float64Array(n)
  for (let i = 0; i < n; i++) k[i] = -L / 2 + (i + 0.5) * dx < 0 ? kL : kR
  const steps = Math.ceil(T / stableDt(d, dx, 0.8))
  const dt = T / steps
  const flows = newStepFlows()
  const bc = { inflowDemand: demand(d, kL), outflowSupply: supply(d, kR), signalInterface: -1, signalOpen: 1 }
  for (let m = 0; m < steps; m++) step(d, k, dt, dx, bc, flows)
  const exact = solveRiemann(d, kL, kR)
  let e = 0
  for (let i = 0; i < n; i++) e += Math.abs(k[i] - exact.sample((-L / 2 + (i + 0.5) * dx) / T)) * dx
  return e
}

/** Least-squares slope of log(error) against log(1/dx): the experimental order. */
function experimentalOrder(d: Diagram, kL: number, kR: number): { order: number; errors: number[] } {
  const ns = [100, 200, 400, 800, 1600]
  const errors = ns.map((n) => riemannError(d, kL, kR, n))
  const xs = ns.map(Math.log)
  const ys = errors.map(Math.log)
  const mx = xs.reduce((a, b) => a + b) / xs.length
  const my = ys.reduce((a, b) => a + b) / ys.length
  let num = 0
  let den = 0
  for (let i = 0; i < xs.length; i++) { num += (xs[i] - mx) * (ys[i] - my); den += (xs[i] - mx) ** 2 }
  return { order: -num / den, errors }
}

describe('convergence to the exact Riemann solution on doubled grids', () => {
  // First-order monotone scheme: order 1 for shocks and genuine fans in L1; contact lines (the
  // triangular diagram's fans) smear like sqrt(t dx), so order 1/2 there.
  it.each([
    ['Greenshields shock', gs, 0.02, 0.08, 0.85],
    ['Greenshields fan (queue discharge)', gs, 0.12, 0, 0.7],
    ['Greenshields fan inside the free branch', gs, 0.1, 0.02, 0.7],
    ['triangular shock (arrivals meet a jam)', tri, 0.01, 0.12, 0.8],
  ] as const)('%s converges with order >= %s', (_name, d, kL, kR, _expected) => {
    const { order, errors } = experimentalOrder(d, kL, kR)
    for (let i = 1; i < errors.length; i++) expect(errors[i]).toBeLessThan(errors[i - 1])
    expect(order).toBeGreaterThan(_expected)
    expect(order).toBeLessThan(1.3)
  })

  it('triangular discharge (two contact lines) converges with order about 1/2', () => {
    const { order, errors } = experimentalOrder(tri, 0.12, 0.01)
    for (let i = 1; i < errors.length; i++) expect(errors[i]).toBeLessThan(errors[i - 1])
    expect(order).toBeGreaterThan(0.4)
    expect(order).toBeLessThan(0.7)
  })
})

describe('conservation and bounds', () => {
  it.each([['triangular', tri], ['greenshields', gs]] as [string, Diagram][])('%s: vehicles in = vehicles out + change inside, through a signal', (_n, d) => {
    const n = 120
    const dx = 5
    const dt = stableDt(d, dx, 0.9)
    const k = new Float64Array(n).fill(freeDensity(d, 0.5 * capacity(d)))
    const steps = 3000
    const open = openShares(fixedTimePlan(67, 29, 0, 10), 0, dt, steps)
    const flows = newStepFlows()
    const before = k.reduce((a, b) => a + b) * dx
    let inflow = 0
    let outflow = 0
    let lo = Infinity
    let hi = -Infinity
    for (let m = 0; m < steps; m++) {
      step(d, k, dt, dx, { inflowDemand: 0.5 * capacity(d), outflowSupply: capacity(d), signalInterface: 80, signalOpen: open[m] }, flows)
      inflow += flows.inflow * dt
      outflow += flows.outflow * dt
      for (const x of k) { if (x < lo) lo = x; if (x > hi) hi = x }
    }
    expect(lo).toBeGreaterThanOrEqual(-1e-12)
    expect(hi).toBeLessThanOrEqual(d.kj + 1e-12)
    expect(hi).toBeGreaterThan(0.9 * d.kj)
    const after = k.reduce((a, b) => a + b) * dx
    expect(inflow).toBeGreaterThan(10)
    expect(after - before).toBeCloseTo(inflow - outflow, 9)
  })

  it('holds everything behind a red and passes nothing', () => {
    const d = tri
    const k = new Float64Array(40).fill(0.01)
    const flows = newStepFlows()
    for (let m = 0; m < 200; m++) step(d, k, 0.3, 5, { inflowDemand: 0.1, outflowSupply: capacity(d), signalInterface: 20, signalOpen: 0 }, flows)
    expect(flows.signal).toBe(0)
    expect(k[19]).toBeCloseTo(d.kj, 3)
    expect(Math.max(...k.slice(21))).toBeLessThan(1e-6)
  })

  it('bounds the step by the fastest wave', () => {
    expect(stableDt(tri, 10, 1)).toBeCloseTo(10 / tri.vf, 12)
    expect(stableDt(triangularFromWaveSpeed({ freeFlowSpeedKmh: 20, backwardWaveSpeedKmh: 30, jamDensityVehPerKmPerLane: 120 }), 10, 0.5)).toBeCloseTo(5 / (30 / 3.6), 12)
  })
})

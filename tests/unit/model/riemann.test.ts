import { describe, expect, it } from 'vitest'
import { type Diagram, flux, godunovFlux, greenshields, solveRiemann, triangularFromWaveSpeed } from '../../../shared/model'

const tri = triangularFromWaveSpeed({ freeFlowSpeedKmh: 60, backwardWaveSpeedKmh: 20, jamDensityVehPerKmPerLane: 120 })
const gs = greenshields({ freeFlowSpeedKmh: 60, jamDensityVehPerKmPerLane: 120 })
const pairs = (d: Diagram): [number, number][] => {
  const ks = [0, 0.1, 0.25, 0.4, 0.5, 0.6, 0.8, 1].map((f) => f * d.kj)
  return ks.flatMap((a) => ks.map((b) => [a, b] as [number, number]))
}

describe.each([['triangular', tri], ['greenshields', gs]] as [string, Diagram][])('exact Riemann solution, %s', (_n, d) => {
  it('conserves vehicles: the integral over [-a, a] grows by q(kL) - q(kR) per unit time', () => {
    // self-similar, so at t = 1: integral of k(x) dx over [-a, a] = a (kL + kR) + q(kL) - q(kR)
    const a = 40
    const n = 200_000
    for (const [kL, kR] of pairs(d)) {
      const sol = solveRiemann(d, kL, kR)
      let integral = 0
      for (let i = 0; i < n; i++) integral += sol.sample(-a + ((i + 0.5) * 2 * a) / n) * ((2 * a) / n)
      expect(integral).toBeCloseTo(a * (kL + kR) + flux(d, kL) - flux(d, kR), 3)
    }
  })

  it('keeps the initial states outside the waves', () => {
    for (const [kL, kR] of pairs(d)) {
      const sol = solveRiemann(d, kL, kR)
      expect(sol.sample(-1e3)).toBe(kL)
      expect(sol.sample(1e3)).toBe(kR)
    }
  })

  it('gives the Godunov flux at x/t = 0: min(demand(kL), supply(kR))', () => {
    for (const [kL, kR] of pairs(d)) {
      expect(godunovFlux(d, kL, kR)).toBeCloseTo(flux(d, solveRiemann(d, kL, kR).sample(0)), 9)
    }
  })

  it('has a shock when density rises and a fan or contacts when it falls', () => {
    for (const [kL, kR] of pairs(d)) {
      const { waves } = solveRiemann(d, kL, kR)
      if (kL === kR) expect(waves).toHaveLength(0)
      else if (kL < kR) expect(waves.map((w) => w.type)).toEqual(['shock'])
      else expect(waves.every((w) => w.type !== 'shock')).toBe(true)
    }
  })
})

describe('triangular fans are contact lines', () => {
  it('splits a queue discharge into a -w contact to capacity and a vf contact to the free state', () => {
    const { waves, sample } = solveRiemann(tri, tri.kj, 0.005)
    expect(waves).toEqual([
      { type: 'contact', speed: -tri.w, kLeft: tri.kj, kRight: 0.03 },
      { type: 'contact', speed: tri.vf, kLeft: 0.03, kRight: 0.005 },
    ])
    expect(sample(0)).toBeCloseTo(0.03, 12)
  })

  it('moves a jump within one branch at that branch\'s speed', () => {
    expect(solveRiemann(tri, 0.02, 0.01).waves).toEqual([{ type: 'contact', speed: tri.vf, kLeft: 0.02, kRight: 0.01 }])
    expect(solveRiemann(tri, 0.1, 0.05).waves).toEqual([{ type: 'contact', speed: -tri.w, kLeft: 0.1, kRight: 0.05 }])
  })
})

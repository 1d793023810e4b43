import { describe, expect, it } from 'vitest'
import {
  type Diagram, capacity, congestedDensity, criticalDensity, demand, densityAtWaveSpeed, flux, forLanes, freeDensity,
  greenshields, greenshieldsFromCapacity, maxWaveSpeed, speed, supply, triangularFromSaturationFlow, triangularFromWaveSpeed,
  waveSpeed,
} from '../../../shared/model'

const tri = triangularFromWaveSpeed({ freeFlowSpeedKmh: 50, backwardWaveSpeedKmh: 18, jamDensityVehPerKmPerLane: 140 })
const gs = greenshields({ freeFlowSpeedKmh: 50, jamDensityVehPerKmPerLane: 140 })
const diagrams: [string, Diagram][] = [['triangular', tri], ['greenshields', gs]]
const grid = (d: Diagram) => Array.from({ length: 101 }, (_, i) => (i / 100) * d.kj)

describe.each(diagrams)('%s diagram', (_name, d) => {
  it('is zero at both ends and peaks at the critical density', () => {
    expect(flux(d, 0)).toBe(0)
    expect(flux(d, d.kj)).toBeCloseTo(0, 12)
    const kc = criticalDensity(d)
    for (const k of grid(d)) expect(flux(d, k)).toBeLessThanOrEqual(capacity(d) + 1e-12)
    expect(flux(d, kc)).toBeCloseTo(capacity(d), 12)
  })

  it('is concave: q(mid) >= mean of the ends for any chord', () => {
    const ks = grid(d)
    for (let i = 0; i < ks.length; i += 7) for (let j = i + 3; j < ks.length; j += 11) {
      expect(flux(d, (ks[i] + ks[j]) / 2)).toBeGreaterThanOrEqual((flux(d, ks[i]) + flux(d, ks[j])) / 2 - 1e-12)
    }
  })

  it('has the wave speed q\'(k) away from the kink', () => {
    const h = 1e-7
    for (const f of [0.05, 0.2, 0.4, 0.6, 0.8, 0.95]) {
      const k = f * d.kj
      if (Math.abs(k - criticalDensity(d)) < 1e-4) continue
      expect(waveSpeed(d, k)).toBeCloseTo((flux(d, k + h) - flux(d, k - h)) / (2 * h), 4)
      expect(Math.abs(waveSpeed(d, k))).toBeLessThanOrEqual(maxWaveSpeed(d) + 1e-12)
    }
  })

  it('has speed q/k, the free-flow speed when empty and zero when jammed', () => {
    expect(speed(d, 0)).toBe(d.vf)
    expect(speed(d, d.kj)).toBe(0)
    for (const k of grid(d).slice(1, -1)) expect(speed(d, k) * k).toBeCloseTo(flux(d, k), 12)
  })

  it('inverts onto each branch', () => {
    for (const f of [0, 0.1, 0.5, 0.9, 0.999]) {
      const q = f * capacity(d)
      const kf = freeDensity(d, q)
      const kg = congestedDensity(d, q)
      expect(kf).toBeLessThanOrEqual(criticalDensity(d) + 1e-12)
      expect(kg).toBeGreaterThanOrEqual(criticalDensity(d) - 1e-12)
      expect(flux(d, kf)).toBeCloseTo(q, 9)
      expect(flux(d, kg)).toBeCloseTo(q, 9)
    }
  })

  it('sends up to capacity below kc and receives up to capacity above it', () => {
    for (const k of grid(d)) {
      expect(demand(d, k)).toBeCloseTo(k <= criticalDensity(d) ? flux(d, k) : capacity(d), 12)
      expect(supply(d, k)).toBeCloseTo(k >= criticalDensity(d) ? flux(d, k) : capacity(d), 12)
    }
  })

  it('inverts the wave speed inside a fan', () => {
    for (const f of [0.1, 0.3, 0.7]) {
      const k = f * d.kj
      const c = waveSpeed(d, k)
      if (d.kind === 'greenshields') expect(densityAtWaveSpeed(d, c)).toBeCloseTo(k, 12)
      else expect(densityAtWaveSpeed(d, (c + (k < criticalDensity(d) ? -1 : 1)) * 0.5)).toBeCloseTo(criticalDensity(d), 12)
    }
  })

  it('scales with lanes: capacity and jam density grow, speeds stay', () => {
    const two = forLanes(d, 2)
    expect(capacity(two)).toBeCloseTo(2 * capacity(d), 12)
    expect(two.kj).toBeCloseTo(2 * d.kj, 12)
    expect(speed(two, 2 * 0.3 * d.kj)).toBeCloseTo(speed(d, 0.3 * d.kj), 12)
  })
})

describe('calibration', () => {
  it('builds the triangle through a saturation flow, free speed and jam density', () => {
    const t = triangularFromSaturationFlow({ saturationFlowVehPerHourPerLane: 1800, freeFlowSpeedKmh: 60, jamDensityVehPerKmPerLane: 120 })
    expect(capacity(t) * 3600).toBeCloseTo(1800, 9)
    expect(t.w * 3.6).toBeCloseTo(20, 9)
    expect(() => triangularFromSaturationFlow({ saturationFlowVehPerHourPerLane: 8000, freeFlowSpeedKmh: 60, jamDensityVehPerKmPerLane: 120 })).toThrow(RangeError)
  })

  it('builds Greenshields through a capacity and free speed', () => {
    const g = greenshieldsFromCapacity({ capacityVehPerHourPerLane: 1800, freeFlowSpeedKmh: 60 }, 2)
    expect(g.kj * 1000).toBeCloseTo(240, 9)
    expect(capacity(g) * 3600).toBeCloseTo(3600, 9)
  })
})

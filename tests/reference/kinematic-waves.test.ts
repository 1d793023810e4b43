import { describe, expect, it } from 'vitest'
import {
  capacity, criticalDensity, flux, greenshields, kmhToMps, mpsToKmh, perSToPerHour, solveRiemann, speed,
  triangularFromWaveSpeed, waveSpeed,
} from '../../shared/model'

// Values per km and per hour are converted to the model's SI at the edge of each check.
const perKm = (k: number) => k / 1000
const vehPerHour = (qPerS: number) => perSToPerHour(qPerS)

describe('Greenshields diagram', () => {
  // Greenshields 1935; Lighthill & Whitham 1955: q = vf k (1 - k/kj), capacity vf kj / 4 at kj / 2,
  // c(k) = vf (1 - 2k/kj). vf = 60 km/h, kj = 120 veh/km.
  const g = greenshields({ freeFlowSpeedKmh: 60, jamDensityVehPerKmPerLane: 120 })

  it('has capacity 1800 veh/h at 60 veh/km', () => {
    expect(vehPerHour(capacity(g))).toBeCloseTo(1800, 9)
    expect(criticalDensity(g) * 1000).toBeCloseTo(60, 9)
  })

  it('carries 1350 veh/h at 30 veh/km', () => {
    expect(vehPerHour(flux(g, perKm(30)))).toBeCloseTo(1350, 9)
  })

  it('has wave speeds 30, 60 and -60 km/h at 30, 0 and 120 veh/km', () => {
    expect(mpsToKmh(waveSpeed(g, perKm(30)))).toBeCloseTo(30, 9)
    expect(mpsToKmh(waveSpeed(g, 0))).toBeCloseTo(60, 9)
    expect(mpsToKmh(waveSpeed(g, perKm(120)))).toBeCloseTo(-60, 9)
  })
})

describe('Rankine-Hugoniot shock', () => {
  // Whitham 1974, Linear and Nonlinear Waves: s = (q2 - q1)/(k2 - k1). Arrivals at 20 veh/km
  // (1000 veh/h on the Greenshields diagram above) meeting a jam: s = -10 km/h.
  it('runs back at 10 km/h where arrivals at 20 veh/km meet a jam', () => {
    const g = greenshields({ freeFlowSpeedKmh: 60, jamDensityVehPerKmPerLane: 120 })
    expect(vehPerHour(flux(g, perKm(20)))).toBeCloseTo(1000, 9)
    const sol = solveRiemann(g, perKm(20), perKm(120))
    expect(sol.waves).toHaveLength(1)
    const wave = sol.waves[0]
    expect(wave.type).toBe('shock')
    if (wave.type === 'shock') expect(mpsToKmh(wave.speed)).toBeCloseTo(-10, 9)
  })
})

describe('red-to-green start on a Greenshields road', () => {
  // Lighthill & Whitham 1955 sec. 6 (the same derivation is in Haberman, Mathematical Models,
  // SIAM Classics; section number from memory): fan k = (kj/2)(1 - x/(vf t)) for |x| <= vf t;
  // at the line k = kj/2 and q = q_max; a vehicle d behind the line starts at d/vf and crosses at
  // 4d/vf at vf/2. d = 100 m, vf = 60 km/h: starts 6 s, crosses 24 s; kj d = 12 vehicles ahead
  // = q_max x 24 s.
  const g = greenshields({ freeFlowSpeedKmh: 60, jamDensityVehPerKmPerLane: 120 })
  const fan = solveRiemann(g, g.kj, 0)
  const vf = kmhToMps(60)

  it('has the fan profile', () => {
    expect(fan.waves[0].type).toBe('rarefaction')
    for (const xi of [-0.9, -0.5, 0, 0.3, 0.8].map((f) => f * vf)) {
      expect(fan.sample(xi)).toBeCloseTo((g.kj / 2) * (1 - xi / vf), 12)
    }
    expect(fan.sample(-1.01 * vf)).toBe(g.kj)
    expect(fan.sample(1.01 * vf)).toBe(0)
    expect(vehPerHour(flux(g, fan.sample(0)))).toBeCloseTo(1800, 9)
  })

  it('moves a vehicle 100 m back off at 6 s and over the line at 24 s, at half the free speed', () => {
    const d = 100
    const v = (t: number, x: number) => speed(g, fan.sample(x / t))
    const t0 = d / vf
    expect(t0).toBeCloseTo(6, 9)
    // RK4 through the exact fan
    let t = t0
    let x = -d
    const h = 1e-3
    let crossing = NaN
    while (t < 40) {
      const k1 = v(t, x)
      const k2 = v(t + h / 2, x + (h / 2) * k1)
      const k3 = v(t + h / 2, x + (h / 2) * k2)
      const k4 = v(t + h, x + h * k3)
      const xNext = x + (h / 6) * (k1 + 2 * k2 + 2 * k3 + k4)
      if (x < 0 && xNext >= 0) { crossing = t + (h * -x) / (xNext - x); break }
      x = xNext
      t += h
    }
    expect(crossing).toBeCloseTo(24, 2)
    expect(mpsToKmh(v(crossing, 0))).toBeCloseTo(30, 6)
    expect(x + 2 * Math.sqrt(d * vf * t) - vf * t).toBeCloseTo(0, 3)
    expect(g.kj * d).toBeCloseTo(12, 9)
    expect(capacity(g) * 24).toBeCloseTo(12, 9)
  })
})

describe('triangular diagram', () => {
  // Newell 1993, TR-B 27(4):281-287; Daganzo 1994, TR-B 28(4):269-287: q = min(vf k, w (kj - k)),
  // capacity vf w kj / (vf + w). vf = 60, w = 20 km/h, kj = 120 veh/km: 1800 veh/h at 30 veh/km.
  it('has capacity 1800 veh/h at 30 veh/km', () => {
    const t = triangularFromWaveSpeed({ freeFlowSpeedKmh: 60, backwardWaveSpeedKmh: 20, jamDensityVehPerKmPerLane: 120 })
    expect(vehPerHour(capacity(t))).toBeCloseTo(1800, 9)
    expect(criticalDensity(t) * 1000).toBeCloseTo(30, 9)
    expect(vehPerHour(flux(t, perKm(30)))).toBeCloseTo(1800, 9)
  })
})

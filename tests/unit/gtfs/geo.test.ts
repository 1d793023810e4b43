import { describe, expect, it } from 'vitest'
import { cumulativeDistanceM, haversineM, projectOntoPolyline } from '../../../shared/gtfs/geo'

describe('distances on the Earth', () => {
  it('gives 2 pi R / 360 for one degree of latitude on the mean sphere (R = 6 371 008.8 m, IUGG)', () => {
    expect(haversineM(47, 9, 48, 9)).toBeCloseTo((2 * Math.PI * 6_371_008.8) / 360, 3)
  })

  it('shrinks a degree of longitude by the cosine of the latitude', () => {
    // Small steps, where the great circle and the parallel agree to well under a metre.
    const step = haversineM(60, 9, 60, 9.01)
    expect(step).toBeCloseTo((2 * Math.PI * 6_371_008.8 * Math.cos(Math.PI / 3)) / 36_000, 1)
  })

  it('accumulates along a polyline', () => {
    const cum = cumulativeDistanceM([47, 47, 47.01], [9, 9.01, 9.01])
    expect(cum[0]).toBe(0)
    expect(cum[2]).toBeCloseTo(haversineM(47, 9, 47, 9.01) + haversineM(47, 9.01, 47.01, 9.01), 6)
  })
})

describe('projectOntoPolyline', () => {
  // An out-and-back line: east 1.5 km, then back west 8 m further north.
  const lat = [47.6, 47.6, 47.600072, 47.600072]
  const lon = [8.9, 8.92, 8.92, 8.9]
  const cum = cumulativeDistanceM(lat, lon)

  it('finds the distance along the line and the offset from it', () => {
    const p = projectOntoPolyline(47.60003, 8.91, lat, lon, cum)
    expect(p.segment).toBe(0)
    expect(p.distM).toBeCloseTo(cum[1] / 2, 0)
    expect(p.offsetM).toBeCloseTo(3.3, 0)
  })

  it('searches only forward, so the way back is found for a stop on both legs', () => {
    const out = projectOntoPolyline(47.600036, 8.91, lat, lon, cum)
    const back = projectOntoPolyline(47.600036, 8.91, lat, lon, cum, 1, cum[1])
    expect(out.segment).toBe(0)
    expect(back.segment).toBe(2)
    expect(back.distM).toBeGreaterThan(cum[2])
  })

  it('never goes back past the distance it starts from', () => {
    const p = projectOntoPolyline(47.6, 8.905, lat, lon, cum, 0, 1000)
    expect(p.distM).toBeGreaterThanOrEqual(1000)
  })
})

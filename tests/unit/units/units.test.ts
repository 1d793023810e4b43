import { describe, expect, it } from 'vitest'
import { density, distance, longDistance, show, speed } from '../../../shared/units/units'

// The international foot and mile: 1 ft = 0.3048 m and 1 mi = 1609.344 m exactly
// [P: NIST Handbook 44, Appendix C; the 1959 international yard and pound agreement].
describe('metric and US customary units', () => {
  it('shows distances in the unit their size calls for', () => {
    expect(distance(450, 'metric')).toEqual({ value: 450, unit: 'm' })
    expect(distance(8897, 'metric')).toEqual({ value: 8.9, unit: 'km' })
    // 8 897 m / 1 609.344 = 5.528 mi; 150 m / 0.3048 = 492.1 ft (hand-checked).
    expect(distance(8897, 'us')).toEqual({ value: 5.53, unit: 'mi' })
    expect(distance(150, 'us')).toEqual({ value: 492, unit: 'ft' })
    expect(longDistance(400, 'us')).toEqual({ value: 0.25, unit: 'mi' })
    expect(show(distance(12_345, 'metric'))).toBe('12.35 km')
  })

  it('converts speeds and densities', () => {
    // 50 km/h = 31.07 mph; 120 veh/km = 193.1 veh/mi (x 1.609344).
    expect(speed(50, 'us')).toEqual({ value: 31.1, unit: 'mph' })
    expect(speed(50, 'metric')).toEqual({ value: 50, unit: 'km/h' })
    expect(density(120, 'us')).toEqual({ value: 193.1, unit: 'veh/mi' })
    expect(show(density(133, 'metric'))).toBe('133 veh/km')
  })
})

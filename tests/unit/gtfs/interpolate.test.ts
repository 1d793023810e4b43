import { describe, expect, it } from 'vitest'
import { interpolateStopTimes } from '../../../shared/gtfs/interpolate'

// GTFS Schedule reference, stop_times.txt: stops that are not timepoints may leave their times
// empty; consumers interpolate them between the timed stops.
describe('interpolateStopTimes', () => {
  it('interpolates on distance between the timed stops around the gap', () => {
    const arr = [0, NaN, NaN, 600]
    const dep = [0, NaN, NaN, 600]
    const interpolated = interpolateStopTimes(arr, dep, [0, 100, 400, 1000])
    // 100 m and 400 m of 1000 m over 600 s.
    expect(arr).toEqual([0, 60, 240, 600])
    expect(dep).toEqual(arr)
    expect(interpolated).toEqual([false, true, true, false])
  })

  it('starts from the departure of the stop before and ends at the arrival of the stop after', () => {
    const arr = [0, NaN, 700]
    const dep = [100, NaN, 720]
    interpolateStopTimes(arr, dep, [0, 500, 1000])
    expect(arr[1]).toBe(400)
  })

  it('falls back to counting stops when distances are missing or do not increase', () => {
    const a1 = [0, NaN, NaN, 300], d1 = [0, NaN, NaN, 300]
    interpolateStopTimes(a1, d1, null)
    expect(a1).toEqual([0, 100, 200, 300])
    const a2 = [0, NaN, 300], d2 = [0, NaN, 300]
    interpolateStopTimes(a2, d2, [0, 0, 0])
    expect(a2).toEqual([0, 150, 300])
  })

  it('copies a lone arrival or departure to the other, without calling it interpolated', () => {
    const arr = [NaN, 120, 300], dep = [60, NaN, NaN]
    const interpolated = interpolateStopTimes(arr, dep, [0, 1, 2])
    expect(arr).toEqual([60, 120, 300])
    expect(dep).toEqual([60, 120, 300])
    expect(interpolated).toEqual([false, false, false])
  })

  it('rounds to whole seconds', () => {
    const arr = [0, NaN, 100], dep = [0, NaN, 100]
    interpolateStopTimes(arr, dep, [0, 1, 3])
    expect(arr[1]).toBe(33)
  })
})

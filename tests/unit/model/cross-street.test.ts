import { describe, expect, it } from 'vitest'
import {
  availableGreenS, busApproachChanges, crossStreetChanges, crossStreetGreenS, grantEffect, periodDelay, redGreen,
} from '../../../shared/model'

// cross street: 500 veh/h against 1800 veh/h of saturation flow, 30 s green in a 60 s cycle
const q = 500 / 3600
const s = 1800 / 3600
const red = 30
const green = 30
/** point-queue area of one cycle that starts empty with a red of r: q r^2 s / (2 (s - q)) */
const area = (r: number, qq = q, ss = s) => (qq * r * r * ss) / (2 * (ss - qq))

describe('point queue', () => {
  it('matches the triangle area of an undersaturated cycle', () => {
    const rg = redGreen(q, s, 0, red, green)
    expect(rg.area).toBeCloseTo(area(red), 9)
    expect(rg.queueAtEnd).toBe(0)
    expect(rg.clearAfterGreen).toBeCloseTo((q * red) / (s - q), 12)
  })

  it('carries a residual queue through oversaturated cycles', () => {
    const over = periodDelay(1000 / 3600, s, 60, 30, 900)
    expect(over.cycles).toBe(15)
    // each cycle adds q C - s g vehicles
    expect(over.residualVeh).toBeCloseTo(15 * ((1000 / 3600) * 60 - s * 30), 9)
  })
})

describe('what a grant costs the cross street', () => {
  it('has a budget of its green above the larger of min green and walk + clearance', () => {
    expect(crossStreetGreenS(60, 30, 0)).toBe(30)
    expect(crossStreetGreenS(90, 40, 8)).toBe(42)
    expect(availableGreenS(30, 10, 7, 12)).toBe(11)
    expect(availableGreenS(30, 22, 7, 12)).toBe(8)
    expect(availableGreenS(15, 22, 7, 12)).toBe(0)
  })

  it('adds area(r + T) - area(r) when the queue recovers within the cycle', () => {
    for (const T of [2, 5, 10]) {
      const ext = grantEffect(q, s, red, green, crossStreetChanges('green-extension', T), 20)
      expect(ext.extraVehS).toBeCloseTo(area(red + T) - area(red), 9)
      expect(ext.recoveryCycles).toBe(1)
      expect(ext.extraQueueVeh).toBeCloseTo(q * T, 12)
      // taken from the end of a green the queue had already cleared: the next red is T longer
      const early = grantEffect(q, s, red, green, crossStreetChanges('early-green', T), 20)
      expect(early.extraVehS).toBeCloseTo(area(red + T) - area(red), 9)
      expect(early.recoveryCycles).toBe(2)
    }
  })

  it('takes several cycles to recover on a busy cross street, and costs more than one cycle\'s share', () => {
    const busy = 870 / 3600
    const ext = grantEffect(busy, s, red, green, crossStreetChanges('green-extension', 10), 50)
    expect(ext.recoveryCycles).toBeGreaterThan(2)
    expect(ext.extraVehS).toBeGreaterThan(area(red + 10, busy) - area(red, busy))
  })

  it('gives the cars of the bus approach the same green back', () => {
    const main = grantEffect(q, s, red, green, busApproachChanges('green-extension', 6), 20)
    expect(main.extraVehS).toBeCloseTo(area(red - 6) - area(red), 9)
    const early = grantEffect(q, s, red, green, busApproachChanges('early-green', 6), 20)
    expect(early.extraVehS).toBeCloseTo(area(red - 6) - area(red), 9)
    expect(grantEffect(q, s, red, green, [], 20).extraVehS).toBe(0)
  })
})

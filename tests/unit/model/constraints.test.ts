import { describe, expect, it } from 'vitest'
import { checkApproach, checkTimeSpace } from '../../../shared/model'
import { approachBody, timeSpaceBody, type ApproachBody } from '../../../shared/schemas/model'

const check = (body: ApproachBody) => checkApproach(approachBody.parse(body))
const fields = (body: ApproachBody) => check(body).map((v) => v.field)

describe('settings the model refuses', () => {
  it('accepts the typical approach', () => {
    expect(check({})).toEqual([])
  })

  it('refuses a bus green as long as the cycle', () => {
    expect(fields({ signal: { cycleS: 60, effectiveGreenS: 60 } })).toEqual(['signal.effectiveGreenS'])
  })

  it('refuses a lost time that leaves the cross street no green', () => {
    expect(fields({ signal: { cycleS: 60, effectiveGreenS: 40, lostTimeS: 20 } })).toEqual(['signal.lostTimeS'])
  })

  it('refuses a timing below the cross street\'s minimum green, and below walk + clearance', () => {
    const v = check({ signal: { cycleS: 60, effectiveGreenS: 52 }, priority: { strategy: 'none' } })
    expect(v.map((x) => x.field)).toEqual(['signal.effectiveGreenS', 'signal.effectiveGreenS'])
    expect(v[0].reason).toMatch(/8 s of green, less than its minimum green of 10 s/)
    expect(v[1].reason).toMatch(/walk \+ clearance of 19 s/)
  })

  it('refuses priority limits above what the cross street can give', () => {
    const v = check({ priority: { strategy: 'both', maxExtensionS: 12, maxEarlyGreenS: 15 } })
    expect(v.map((x) => x.field)).toEqual(['priority.maxExtensionS', 'priority.maxEarlyGreenS'])
    expect(v[0].reason).toMatch(/11 s can be taken/)
    // only the limits the strategy uses count
    expect(fields({ priority: { strategy: 'green-extension', maxExtensionS: 10, maxEarlyGreenS: 30 } })).toEqual([])
  })

  it('refuses an extension and an early green that together overrun the budget without a lockout', () => {
    expect(fields({ priority: { strategy: 'both', maxExtensionS: 8, maxEarlyGreenS: 8, lockoutCycles: 0 } })).toEqual(['priority.lockoutCycles'])
    expect(fields({ priority: { strategy: 'both', maxExtensionS: 8, maxEarlyGreenS: 8, lockoutCycles: 1 } })).toEqual([])
  })

  it('refuses a check-in point and bus stops off the modelled approach', () => {
    expect(fields({ priority: { checkInDistanceM: 500 } })).toEqual(['priority.checkInDistanceM'])
    expect(fields({ bus: { stop: { position: 'near-side', distanceM: 450 } } })).toEqual(['bus.stop.distanceM'])
    expect(fields({ bus: { stop: { position: 'far-side', distanceM: 200 } } })).toEqual(['bus.stop.distanceM'])
    expect(fields({ bus: { stop: { position: 'none', distanceM: 2000 } } })).toEqual([])
  })

  it('refuses flows the roads cannot carry', () => {
    expect(fields({ approach: { arrivalFlowVehPerHour: 1800 } })).toEqual(['approach.arrivalFlowVehPerHour'])
    expect(fields({ approach: { arrivalFlowVehPerHour: 1800, lanes: 2 } })).toEqual([])
    expect(fields({ crossStreet: { arrivalFlowVehPerHour: 1900 } })).toEqual(['crossStreet.arrivalFlowVehPerHour'])
  })

  it('refuses time-space grids that are too coarse or too costly', () => {
    expect(checkTimeSpace(timeSpaceBody.parse({}))).toEqual([])
    expect(checkTimeSpace(timeSpaceBody.parse({ dxM: 50, approach: { lengthM: 100 }, priority: { checkInDistanceM: 80 } })).map((v) => v.field)).toEqual(['dxM'])
    const costly = checkTimeSpace(timeSpaceBody.parse({ dxM: 1, cycles: 6, signal: { cycleS: 300, effectiveGreenS: 150 }, approach: { lengthM: 5000 } }))
    expect(costly.map((v) => v.field)).toEqual(['dxM'])
    expect(costly[0].reason).toMatch(/use at least/)
    expect(checkTimeSpace(timeSpaceBody.parse({ busArrivalPhaseS: 75 })).map((v) => v.field)).toEqual(['busArrivalPhaseS'])
  })
})

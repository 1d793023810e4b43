import { describe, expect, it } from 'vitest'
import { corridorSavings, statusShares } from '../../../shared/savings/corridor-savings'
import { resultKey, type PeriodFigures, type RowFigures } from '../../../shared/savings/corridor-model'
import type { ScheduleDigest } from '../../../shared/savings/schedule-digest'
import type { SavingsInputsDto } from '../../../shared/schemas/savings'
import { serviceDates } from '../../../shared/gtfs/service-dates'
import { dayOfIso } from '../../../shared/gtfs/date'

// A corridor worked by hand. Two signals (a0, a1), two periods (AM 07:00-09:00, Midday
// 09:00-15:00), one weekday service running every weekday of 2027 (261 days, no exceptions),
// four eastbound runs of route 7, each 20 minutes through the corridor:
//   r1 enters 07:30, r2 08:00: both signals in AM;  r3 enters 08:55: a0 in AM, a1 in Midday;
//   r4 enters 12:00: both in Midday.
// Savings per bus from the model: a0 10 s (AM) and 6 s (Midday), agreed by the city;
// a1 8 s and 4 s, still with the city.
const h = (hh: number, mm = 0) => hh * 3600 + mm * 60
const year = serviceDates([{ serviceId: 'WK', days: [true, true, true, true, true, false, false], startDay: dayOfIso('2027-01-01'), endDay: dayOfIso('2027-12-31') }], [])
const digest: ScheduleDigest = {
  feedId: 1, directionId: 0, approachIds: ['a0', 'a1'],
  periods: [{ id: 'am', name: 'AM', startTime: '07:00', endTime: '09:00' }, { id: 'mid', name: 'Midday', startTime: '09:00', endTime: '15:00' }],
  routes: ['7'], services: ['WK'],
  runs: [[0, 0, h(7, 30), h(7, 50), '00'], [0, 0, h(8), h(8, 20), '00'], [0, 0, h(8, 55), h(9, 15), '01'], [0, 0, h(12), h(12, 20), '11']],
  // Westbound trips take 25 minutes; eastbound trips are the runs above.
  trips: [[0, 0, 0, h(7, 30), 1200], [0, 0, 0, h(8), 1200], [0, 0, 0, h(8, 55), 1200], [0, 0, 0, h(12), 1200], [0, 1, 0, h(7, 40), 1500], [0, 1, 0, h(12, 30), 1500]],
  serviceDates: { WK: year.get('WK')! },
  feedRange: { startDay: dayOfIso('2027-01-01'), endDay: dayOfIso('2027-12-31') },
}

// Signal a0 in the AM: half the buses arrive on green (no delay) and half wait 20 s; priority
// clears four in five of those. Signal a1 in the AM: 0 s (0.6), 10 s (0.3), 30 s (0.1), the
// same with priority here (its share of priority is taken as nil in this example).
const tenPhases = (base: number[], prio: number[]) => base.map((b, i) => ({ baselineS: b, priorityS: prio[i] }))
const fig = (saving: number, main: number, cross: number, phases: PeriodFigures['phases'] = []): PeriodFigures => ({
  savingPerTripS: saving, crossExtraDelayPerVehS: cross / 100, mainSavedPersonSPerHour: main, crossLostPersonSPerHour: cross, phases, priorityWeight: 1,
})
const row = (id: string, position: number, status: RowFigures['status'], am: PeriodFigures, mid: PeriodFigures): RowFigures => ({
  rowId: id, position, intersectionId: `x-${id}`, intersectionName: `Signal ${id}`, jurisdictionName: 'City of Brackenford', status,
  approachId: id, distanceM: position * 400, stale: false,
  results: { [resultKey('am', 'weekday')]: am, [resultKey('mid', 'weekday')]: mid },
})
const rows = [
  row('a0', 1, 'accepted',
    fig(10, 100, 300, tenPhases([0, 0, 0, 0, 0, 20, 20, 20, 20, 20], [0, 0, 0, 0, 0, 0, 0, 0, 0, 20])), fig(6, 50, 100)),
  row('a1', 2, 'submitted',
    fig(8, 80, 400, tenPhases([0, 0, 0, 0, 0, 0, 10, 10, 10, 30], [0, 0, 0, 0, 0, 0, 10, 10, 10, 30])), fig(4, 20, 60)),
]
const inputs: SavingsInputsDto = {
  defaultLoad: 20, loads: [{ routeId: '7', periodName: 'AM', passengers: 40 }], costPerRevenueHour: 150, currency: 'EUR', costYear: 2027,
  layoverShare: 0.1, source: 'corridor', agencyId: 'agency', corridorId: 'c', version: 1, updatedAt: null, updatedBy: null, mayEdit: false,
}
const figures = corridorSavings({
  corridor: { id: 'c', name: 'Test corridor', lengthM: 1200, routeIds: ['7'], feedId: 1 },
  proposal: { id: 'p', name: 'First round', status: 'submitted', version: 1, evaluatedAt: '2027-01-01T00:00:00Z' },
  schedule: { feedId: 1, feedName: 'feed' }, inputs, digest, rows, referenceDay: dayOfIso('2027-01-01'),
})
const weekday = figures.days.find((d) => d.dayType === 'weekday')!

describe('corridor savings worked by hand', () => {
  it('adds the savings along each trip, agreed rows only and every row as proposed', () => {
    // Agreed: r1 10, r2 10, r3 10 (a0 in AM), r4 6 -> 36 s over 4 trips = 9 s per trip.
    // Proposed: 18, 18, 10 + 4 = 14, 6 + 4 = 10 -> 60 s -> 15 s per trip; 15 / 1200 of run time.
    expect(weekday.trips).toBe(4)
    expect(weekday.runTimeS).toBe(1200)
    expect(weekday.accepted.savingPerTripS).toBeCloseTo(9, 12)
    expect(weekday.proposed.savingPerTripS).toBeCloseTo(15, 12)
    expect(weekday.proposed.shareOfRunTime).toBeCloseTo(0.0125, 12)
    expect(weekday.accepted.vehicleHours).toBeCloseTo(36 / 3600, 12)
    expect(weekday.accepted.cost).toBeCloseTo(1.5, 12)
  })

  it('weighs riders by the load of the route in the period of each crossing', () => {
    // Loads: 40 in the AM, 20 (the default) at Midday. Agreed: 3 x 10 x 40 + 6 x 20 = 1320
    // passenger-seconds; proposed: 2 x 18 x 40 + (10 x 40 + 4 x 20) + 10 x 20 = 2120.
    expect(weekday.accepted.passengerHours).toBeCloseTo(1320 / 3600, 12)
    expect(weekday.proposed.passengerHours).toBeCloseTo(2120 / 3600, 12)
  })

  it('counts the year on the 261 weekdays the service runs', () => {
    expect(figures.annualisation.basis).toBe('calendar')
    expect(figures.annualisation.trips).toBe(4 * 261)
    expect(figures.annual.accepted.vehicleHours).toBeCloseTo(2.61, 10) // 261 x 36 / 3600
    expect(figures.annual.accepted.cost).toBeCloseTo(391.5, 8) // x 150 EUR
    expect(figures.annual.proposed.vehicleHours).toBeCloseTo(4.35, 10)
    expect(figures.annual.proposed.passengerHours).toBeCloseTo((261 * 2120) / 3600, 8)
  })

  it('balances riders’ time against the car occupants of both streets', () => {
    // Agreed (a0 only): bus street cars 100 x 2 h + 50 x 6 h = 500 person-s saved; cross street
    // 300 x 2 + 100 x 6 = 1200 lost; balance (1320 + 500 - 1200) / 3600 h.
    // Proposed: cars 500 + 80 x 2 + 20 x 6 = 780 saved, 1200 + 400 x 2 + 60 x 6 = 2360 lost;
    // balance (2120 + 780 - 2360) / 3600 = 0.15 h.
    const b = figures.personDelay.weekday
    expect(b.accepted.balance).toBeCloseTo(620 / 3600, 12)
    expect(b.proposed.crossStreetOccupantsLost).toBeCloseTo(2360 / 3600, 12)
    expect(b.proposed.balance).toBeCloseTo(0.15, 12)
    expect(figures.annual.proposed.personHoursBalance).toBeCloseTo(261 * 0.15, 8)
  })

  it('splits by the period of entry and by intersection', () => {
    const am = figures.periods.find((p) => p.periodId === 'am' && p.dayType === 'weekday')!
    // r1, r2 and r3 enter in the AM: agreed 10 s each; proposed (18 + 18 + 14) / 3.
    expect(am.trips).toBe(3)
    expect(am.acceptedSavingPerTripS).toBeCloseTo(10, 12)
    expect(am.proposedSavingPerTripS).toBeCloseTo(50 / 3, 12)
    const [x0, x1] = figures.intersections.weekday
    // a0: (10 + 10 + 10 + 6) / 4 buses = 9 s; a1: (8 + 8 + 4 + 4) / 4 = 6 s, none of it agreed yet.
    expect([x0.buses, x0.savingPerBusS, x0.acceptedVehicleHoursPerDay]).toEqual([4, 9, 0.01])
    expect([x1.savingPerBusS, x1.acceptedVehicleHoursPerDay, x1.proposedVehicleHoursPerYear]).toEqual([6, 0, (261 * 24) / 3600])
    expect(figures.hourly.weekday.map((p) => [p.hour, p.trips])).toEqual([[7, 1], [8, 2], [12, 1]])
  })

  it('pads the AM schedule less with priority at the agreed signal', () => {
    // The three AM runs are scheduled at 1200 s; the signals' mean delay without priority is
    // 10 + 6 = 16 s, so 1184 s of the run is not at a signal. Without priority the sum of the
    // delays reaches .85 and .95 at 30 s (by hand in distribution.test.ts): 1214 s both. With
    // priority at a0 (agreed) it reaches .85 at 20 s and .95 at 30 s: 1204 s and 1214 s; mean 1192 s.
    const r = figures.reliability.find((x) => x.periodId === 'am' && x.dayType === 'weekday')!
    expect(r.trips).toBe(3)
    expect(r.scheduledS).toBe(1200)
    expect(r.without).toEqual({ meanS: 1200, p85S: 1214, p95S: 1214 })
    expect(r.accepted).toEqual({ meanS: 1192, p85S: 1204, p95S: 1214 })
    expect(r.intersectionsMissing).toBe(0)
    // No delay-by-phase table at Midday: both signals count as no change.
    expect(figures.reliability.find((x) => x.periodId === 'mid')!.intersectionsMissing).toBe(2)
  })

  it('sizes the fleet from the headway and the round trip with layover', () => {
    // AM: 3 trips in 120 min -> 40-min headway; round trip 20 + 25 = 45 min, + 10% = 49.5 -> 50 min;
    // ceil(50 / 40) = 2 buses, and the few seconds saved change nothing.
    const am = figures.fleet.find((f) => f.dayType === 'weekday')!.routes[0].lines.find((l) => l.periodId === 'am')!
    expect(am).toMatchObject({ headwayMin: 40, roundTripMin: 45, oppositeAssumed: false, cycleMin: { without: 50, accepted: 50 }, vehicles: { without: 2, accepted: 2, proposed: 2 } })
  })

  it('shares the rows out by status', () => {
    expect(figures.status).toMatchObject({ rows: 2, accepted: 0.5, pending: 0.5, refused: 0 })
    expect(statusShares(['rejected', 'accepted', 'change-requested', 'draft'])).toMatchObject({ accepted: 0.25, pending: 0.5, refused: 0.25 })
  })
})

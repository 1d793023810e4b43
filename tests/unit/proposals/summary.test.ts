import { describe, expect, it } from 'vitest'
import { corridorTotals, summariseRow } from '../../../shared/proposals/summary'
import type { PeriodResultDto } from '../../../shared/schemas/proposals'

const period = (o: Partial<PeriodResultDto>): PeriodResultDto => ({
  resultId: 1, periodId: 'p', periodName: 'P', dayType: 'weekday', startTime: '07:00', endTime: '09:00', tripsPerDay: 0,
  timingPlanId: null, timingPlanName: null, cycleS: 90, busDelayBaselineS: 20, busDelayPriorityS: 10, savingPerTripS: 10,
  dailyBusHoursSaved: 0, grantShare: 0.5, crossExtraDelayPerVehS: 1, vcBefore: 0.5, vcAfter: 0.6, losBefore: 'B', losAfter: 'C',
  personDelayBalanceS: 0, error: null, ...o,
})

// Worked by hand: 8 buses saving 12 s and 4 buses saving 6 s give (96 + 24) / 12 = 10 s per bus
// and 120 s = 0.0333 bus-hours a day.
describe('row and corridor summaries', () => {
  const periods = [
    period({ periodId: 'am', tripsPerDay: 8, savingPerTripS: 12, dailyBusHoursSaved: 8 * 12 / 3600, crossExtraDelayPerVehS: 2.5, vcAfter: 0.8, losAfter: 'D', personDelayBalanceS: 5000 }),
    period({ periodId: 'md', tripsPerDay: 4, savingPerTripS: 6, dailyBusHoursSaved: 4 * 6 / 3600, crossExtraDelayPerVehS: 1.0, losBefore: 'C', personDelayBalanceS: -800 }),
    period({ periodId: 'ev', tripsPerDay: 3, savingPerTripS: null, error: 'No timing plan in force.' }),
    period({ periodId: 'sat', dayType: 'saturday', tripsPerDay: 0, savingPerTripS: 4 }),
  ]

  it('weights the saving per bus by the buses of each period and skips periods that failed', () => {
    const [wd, sat] = summariseRow(periods)
    expect(wd.dayType).toBe('weekday')
    expect(wd.tripsPerDay).toBe(12)
    expect(wd.savingPerTripS).toBeCloseTo(10, 12)
    expect(wd.dailyBusHoursSaved).toBeCloseTo(120 / 3600, 12)
    expect(wd.crossExtraDelayPerVehS).toBe(2.5)
    expect(wd.vcAfterMax).toBe(0.8)
    expect(wd.losBeforeWorst).toBe('C')
    expect(wd.losAfterWorst).toBe('D')
    expect(wd.personDelayBalanceS).toBe(4200)
    // No bus runs: the plain mean of the periods.
    expect(sat).toMatchObject({ dayType: 'saturday', tripsPerDay: 0, savingPerTripS: 4 })
  })

  it('adds savings per trip along the corridor, since every bus passes every intersection', () => {
    const a = summariseRow(periods)
    const b = summariseRow([period({ tripsPerDay: 12, savingPerTripS: 5, dailyBusHoursSaved: 60 / 3600, personDelayBalanceS: 100 })])
    const [wd, sat] = corridorTotals([{ summaries: a }, { summaries: b }, { summaries: [] }])
    expect(wd).toMatchObject({ dayType: 'weekday', savingPerTripS: 15, rowsEvaluated: 2, personDelayBalanceS: 4300 })
    expect(wd.dailyBusHoursSaved).toBeCloseTo(180 / 3600, 12)
    expect(sat).toMatchObject({ dayType: 'saturday', rowsEvaluated: 1 })
  })
})

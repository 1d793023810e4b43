import { describe, expect, it } from 'vitest'
import { frequencyStartTimes, shiftTrip } from '../../../shared/gtfs/frequencies'
import { formatGtfsTime, parseGtfsTime } from '../../../shared/gtfs/time'

const t = (s: string) => parseGtfsTime(s)!

// GTFS Schedule reference, frequencies.txt, worked example listed in REFERENCES.md:
// 08:00-10:00 at a headway of 1800 s gives 08:00, 08:30, 09:00, 09:30 (end_time excluded).
describe('frequencyStartTimes', () => {
  it('reproduces the worked example', () => {
    const starts = frequencyStartTimes({ startS: t('08:00:00'), endS: t('10:00:00'), headwayS: 1800 })
    expect(starts.map(formatGtfsTime)).toEqual(['08:00:00', '08:30:00', '09:00:00', '09:30:00'])
  })

  it('keeps a start just before the end and runs past midnight', () => {
    expect(frequencyStartTimes({ startS: t('08:00:00'), endS: t('08:59:00'), headwayS: 300 }).length).toBe(12)
    expect(frequencyStartTimes({ startS: t('23:40:00'), endS: t('24:30:00'), headwayS: 1200 }).map(formatGtfsTime))
      .toEqual(['23:40:00', '24:00:00', '24:20:00'])
  })

  it('gives nothing for a non-positive headway', () => {
    expect(frequencyStartTimes({ startS: 0, endS: 3600, headwayS: 0 })).toEqual([])
  })
})

describe('shiftTrip', () => {
  it('keeps the offsets of the template from its first departure', () => {
    const template = [t('13:13:00'), t('13:20:00'), t('13:30:00')]
    expect(shiftTrip(template, t('13:14:00'), t('08:00:00')).map(formatGtfsTime)).toEqual(['07:59:00', '08:06:00', '08:16:00'])
  })
})

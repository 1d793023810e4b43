import { describe, expect, it } from 'vitest'
import { formatGtfsTime, parseGtfsTime } from '../../../shared/gtfs/time'

// GTFS Schedule reference, stop_times.txt: times count from "noon minus 12 h" and pass 24:00:00
// for trips after midnight.
describe('parseGtfsTime', () => {
  it('reads HH:MM:SS and H:MM:SS', () => {
    expect(parseGtfsTime('08:05:09')).toBe(8 * 3600 + 5 * 60 + 9)
    expect(parseGtfsTime('8:05:09')).toBe(8 * 3600 + 5 * 60 + 9)
    expect(parseGtfsTime('00:00:00')).toBe(0)
  })

  it('counts past midnight: 25:35:00 is 92 100 s (01:35 the next day)', () => {
    // Worked value from the GTFS Schedule reference, as listed in REFERENCES.md.
    expect(parseGtfsTime('25:35:00')).toBe(92_100)
    expect(parseGtfsTime('24:00:00')).toBe(86_400)
    expect(parseGtfsTime('100:00:00')).toBe(360_000)
  })

  it('refuses what is not a GTFS time', () => {
    for (const bad of ['', '8:5:00', '08:60:00', '08:00:60', '08-00-00', '08:00', ' 8:00:00', 'ab:cd:ef', '1000:00:00', '08:00:00Z']) {
      expect(parseGtfsTime(bad), bad).toBeNull()
    }
  })

  it('formats seconds back, keeping hours past 24', () => {
    expect(formatGtfsTime(92_100)).toBe('25:35:00')
    expect(formatGtfsTime(8 * 3600 + 5 * 60 + 9)).toBe('08:05:09')
    expect(parseGtfsTime(formatGtfsTime(100_001))).toBe(100_001)
  })
})

// From days to a year: how many times each service runs in the 12 months from a reference date.
// When the feed's calendar covers the whole 12 months, its real service dates are counted
// (calendar.txt with the exceptions of calendar_dates.txt, already expanded into dates). When
// it covers less, each service's dates over the feed's range are scaled to the 12 months day
// type by day type (weekdays by the weekdays in the year over those in the range, and so on).
import { isoDate } from '../gtfs/date'
import { daysOfType, dayTypeOf, serviceShare, zeroPerDayType, type PerDayType } from '../corridors/day-types'
import { DAY_TYPES, DAY_TYPE_LABELS } from '../signals/time-of-day'

export interface AnnualWindow { fromDay: number; toDay: number }

/** From the reference day to the day before the same date a year later (a year of 365 or 366 days). */
export function annualWindow(referenceDay: number): AnnualWindow {
  const d = new Date(referenceDay * 86_400_000)
  const next = Date.UTC(d.getUTCFullYear() + 1, d.getUTCMonth(), d.getUTCDate())
  return { fromDay: referenceDay, toDay: Math.round(next / 86_400_000) - 1 }
}

export interface ServiceYear {
  basis: 'calendar' | 'scaled'
  window: AnnualWindow
  feedRange: { startDay: number; endDay: number } | null
  daysOfType: PerDayType
  scale: PerDayType | null
  /** Days (possibly fractional when scaled) each service runs in the 12 months, by day type. */
  perService: Map<string, PerDayType>
  note: string
}

const plural = (n: number, one: string) => `${Number.isInteger(n) ? n : n.toFixed(1)} ${one}${n === 1 ? '' : 's'}`

export function serviceYear(
  serviceDates: ReadonlyMap<string, readonly number[]>,
  feedRange: { startDay: number; endDay: number } | null,
  referenceDay: number,
): ServiceYear {
  const window = annualWindow(referenceDay)
  const inYear = daysOfType(window.fromDay, window.toDay)
  const covered = feedRange !== null && feedRange.startDay <= window.fromDay && feedRange.endDay >= window.toDay
  const perService = new Map<string, PerDayType>()
  if (covered || !feedRange) {
    for (const [id, dates] of serviceDates) {
      const n = zeroPerDayType()
      for (const d of dates) if (d >= window.fromDay && d <= window.toDay) n[dayTypeOf(d)]++
      perService.set(id, n)
    }
    return {
      basis: 'calendar', window, feedRange, daysOfType: inYear, scale: null, perService,
      note: feedRange
        ? `Real service dates of each service from ${isoDate(window.fromDay)} to ${isoDate(window.toDay)}, exceptions included.`
        : 'The feed gives no service range: the service dates it lists are counted as they are.',
    }
  }
  const inFeed = daysOfType(feedRange.startDay, feedRange.endDay)
  const scale = zeroPerDayType()
  for (const t of DAY_TYPES) scale[t] = inFeed[t] ? inYear[t] / inFeed[t] : 0
  for (const [id, dates] of serviceDates) {
    const n = zeroPerDayType()
    for (const d of dates) if (d >= feedRange.startDay && d <= feedRange.endDay) n[dayTypeOf(d)]++
    for (const t of DAY_TYPES) n[t] *= scale[t]
    perService.set(id, n)
  }
  const missing = DAY_TYPES.filter((t) => !inFeed[t]).map((t) => DAY_TYPE_LABELS[t].toLowerCase())
  return {
    basis: 'scaled', window, feedRange, daysOfType: inYear, scale, perService,
    note: `The feed covers ${isoDate(feedRange.startDay)} to ${isoDate(feedRange.endDay)} only, less than the 12 months from `
      + `${isoDate(window.fromDay)}: each service's dates in that range are scaled by day type `
      + `(${DAY_TYPES.filter((t) => inFeed[t]).map((t) => `${plural(inYear[t], DAY_TYPE_LABELS[t].toLowerCase())} in the year over ${inFeed[t]} in the feed`).join('; ')}).`
      + (missing.length ? ` The range has no ${missing.join(' or ')}: ${missing.length > 1 ? 'those day types count' : 'that day type counts'} as no service.` : ''),
  }
}

/** How often each service runs on an average day of each type within the feed's range (1 = every such day). */
export function averageDayShares(serviceDates: ReadonlyMap<string, readonly number[]>, feedRange: { startDay: number; endDay: number }): Map<string, PerDayType> {
  const range = daysOfType(feedRange.startDay, feedRange.endDay)
  return new Map([...serviceDates].map(([id, dates]) => [id, serviceShare(dates, range, feedRange.startDay, feedRange.endDay)]))
}

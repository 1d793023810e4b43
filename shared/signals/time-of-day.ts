// Times of day as "HH:MM" (00:00 to 24:00). A window [start, end) whose end is earlier than its
// start runs past midnight (22:00-05:00); 00:00-24:00 is the whole day.

export const DAY_TYPES = ['weekday', 'saturday', 'sunday'] as const
export type DayType = (typeof DAY_TYPES)[number]

export const DAY_TYPE_LABELS: Record<DayType, string> = { weekday: 'Weekday', saturday: 'Saturday', sunday: 'Sunday' }

export const TIME_OF_DAY_PATTERN = /^(?:(?:[01]\d|2[0-3]):[0-5]\d|24:00)$/

/** Minutes after midnight of an "HH:MM" string; NaN when it is not one. */
export function minutesOfDay(hhmm: string): number {
  if (!TIME_OF_DAY_PATTERN.test(hhmm)) return Number.NaN
  const [h, m] = hhmm.split(':').map(Number)
  return h * 60 + m
}

export function formatMinutes(minutes: number): string {
  const m = Math.round(minutes)
  return `${String(Math.floor(m / 60)).padStart(2, '0')}:${String(m % 60).padStart(2, '0')}`
}

export interface TimeWindow { startTime: string; endTime: string }

/** The window as one or two [from, to) minute intervals inside 0..1440. */
export function windowIntervals(w: TimeWindow): [number, number][] {
  const a = minutesOfDay(w.startTime)
  const b = minutesOfDay(w.endTime)
  if (b > a) return [[a, b]]
  if (b < a) return [[a, 1440], [0, b]].filter(([x, y]) => y > x) as [number, number][]
  return []
}

export function windowMinutes(w: TimeWindow): number {
  return windowIntervals(w).reduce((s, [a, b]) => s + b - a, 0)
}

/** Whether minute-of-day t (0 <= t < 1440; larger values wrap) falls in the window. */
export function inWindow(w: TimeWindow, t: number): boolean {
  const m = ((t % 1440) + 1440) % 1440
  return windowIntervals(w).some(([a, b]) => m >= a && m < b)
}

/** Minutes the two windows share (0 when they do not overlap). */
export function overlapMinutes(a: TimeWindow, b: TimeWindow): number {
  let total = 0
  for (const [a0, a1] of windowIntervals(a)) {
    for (const [b0, b1] of windowIntervals(b)) total += Math.max(0, Math.min(a1, b1) - Math.max(a0, b0))
  }
  return total
}

// frequencies.txt: a template trip repeated from start_time at headway_secs while the start is
// before end_time (end excluded). exact_times 1 = schedule-based (these exact starts), empty or
// 0 = frequency-based (the headway is the promise, the starts are nominal). In both kinds only
// the offsets of the template's stop_times from its first departure are used.
// GTFS Schedule reference, frequencies.txt.

export interface FrequencyWindow {
  startS: number
  endS: number
  headwayS: number
}

/** Start times of the trips a window describes. 08:00-10:00 at 1800 s: 08:00, 08:30, 09:00, 09:30. */
export function frequencyStartTimes(w: FrequencyWindow): number[] {
  const out: number[] = []
  if (!(w.headwayS > 0)) return out
  for (let t = w.startS; t < w.endS; t += w.headwayS) out.push(t)
  return out
}

/** Stop times of one run: the template's times moved so that its first departure is at `startS`. */
export function shiftTrip(templateTimes: readonly number[], templateFirstDepartureS: number, startS: number): number[] {
  const shift = startS - templateFirstDepartureS
  return templateTimes.map((t) => t + shift)
}

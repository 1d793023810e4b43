// The demo realtime scenario from the invented sample data: routes 7 and 17 of the Lindenmere
// feed (sample-feeds/lindenmere-gtfs.zip) through the ten Kestrel Avenue / Harbour Road signals
// and their timing plans (sample-feeds/lindenmere-signals.csv). When priority is on it runs at
// the six Kestrel Avenue signals of Brackenford, the city that agreed to it; Harbour Road, in
// Osterfield, keeps plain timing.
import { readFileSync } from 'node:fs'
import { fileURLToPath } from 'node:url'
import Papa from 'papaparse'
import type { DayType } from '../../../shared/signals/time-of-day'
import { readScenarioGtfs } from './scenario-gtfs'
import { RealtimeScenario, type ScenarioSignal } from './scenario'

const sample = (name: string) => fileURLToPath(new URL(`../../../sample-feeds/${name}`, import.meta.url))

export const DEMO_SEED = 20_260_907
export const DEMO_PRIORITY_CITY = 'org-brackenford'
/** Limits of the demo's priority: 15 s each way, the top of the usual 10-15 s (common practice). */
export const DEMO_PRIORITY_LIMITS = { maxExtensionS: 15, maxEarlyGreenS: 15 }

export function demoSignals(csvText: string): ScenarioSignal[] {
  const rows = Papa.parse<Record<string, string>>(csvText, { header: true, skipEmptyLines: true }).data
  const byName = new Map<string, ScenarioSignal>()
  for (const r of rows) {
    let s = byName.get(r.intersection_name)
    if (!s) {
      s = { name: r.intersection_name, lat: Number(r.lat), lon: Number(r.lon), plans: [], priority: r.jurisdiction === DEMO_PRIORITY_CITY }
      byName.set(r.intersection_name, s)
    }
    s.plans.push({
      name: r.plan_name, dayTypes: r.day_types.split(';') as DayType[], startTime: r.start_time, endTime: r.end_time,
      cycleS: Number(r.cycle_s), busGreenS: Number(r.bus_green_s), offsetS: Number(r.offset_s),
    })
  }
  return [...byName.values()]
}

/**
 * directionId 0 keeps the eastbound runs only (the demo corridor's), to keep the archive small;
 * trip updates go in every 60 s unless tripUpdateEveryS says otherwise (0: every feed).
 */
export function loadDemoScenario(opts: { priority: boolean; seed?: number; directionId?: number; tripUpdateEveryS?: number }): RealtimeScenario {
  const gtfs = readScenarioGtfs(readFileSync(sample('lindenmere-gtfs.zip')), ['7', '17'], opts.directionId)
  return new RealtimeScenario(gtfs, {
    seed: opts.seed ?? DEMO_SEED,
    signals: demoSignals(readFileSync(sample('lindenmere-signals.csv'), 'utf8')),
    priority: { enabled: opts.priority, ...DEMO_PRIORITY_LIMITS },
    tripUpdates: true,
    tripUpdateEveryS: opts.tripUpdateEveryS ?? 60,
  })
}

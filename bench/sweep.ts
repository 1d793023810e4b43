// Sweep speed: the full trade-off sweep of one approach (21 x 21 limits x 4 lockouts x 2
// conditions, with the extension-only and early-green-only lines), and the recommendation for a
// 30-approach corridor, in one period and over four periods. Target: the corridor's
// recommendations in under 2 s.
import { performance } from 'node:perf_hooks'
import { evaluateApproach } from '../shared/model'
import { sweepApproach } from '../shared/model/sweep'
import { recommendApproach, recommendPeriods } from '../shared/model/recommend'
import { approachBody, type ApproachInput } from '../shared/schemas/model'
import { sweepPointCount, sweepRanges } from '../shared/schemas/sweep'
import type { CityLimits } from '../shared/schemas/city-limits'

const ranges = sweepRanges.parse({})
const limits: CityLimits = { maxCrossVc: 0.9, worstLos: 'D', maxExtensionS: 12, maxEarlyGreenS: 10, minLockoutCycles: 1 }

/** A deterministic spread of invented approaches: timings, flows and bus stops vary by index. */
function approachAt(a: number, periodLoad = 0.7): ApproachInput {
  const positions = ['none', 'near-side', 'far-side'] as const
  const cycle = [60, 80, 90, 100, 120][a % 5]
  const green = Math.round(cycle * (0.45 + (0.1 * ((a * 7) % 3)) / 2))
  const lanes = 1 + (a % 2)
  return approachBody.parse({
    approach: { lengthM: 250 + 25 * (a % 9), downstreamLengthM: 120, lanes, arrivalFlowVehPerHour: Math.round(periodLoad * 1800 * lanes * (green / cycle)) },
    signal: { cycleS: cycle, effectiveGreenS: green },
    bus: { stop: { position: positions[a % 3], distanceM: 25 + (a % 4) * 10, dwellS: 10 + (a % 5) * 5 }, busesPerHour: 6 + (a % 4) * 3 },
    crossStreet: { arrivalFlowVehPerHour: 300 + 40 * (a % 6), minGreenS: 8, pedWalkS: 7, pedClearanceS: Math.min(12, cycle - green - 15) },
  })
}

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b)
  return s[Math.floor(s.length / 2)]
}

function time<T>(f: () => T, repeats: number): { first: number; median: number; best: number; value: T } {
  let t0 = performance.now()
  const value = f()
  const first = performance.now() - t0
  const times: number[] = []
  for (let r = 0; r < repeats; r++) {
    t0 = performance.now()
    f()
    times.push(performance.now() - t0)
  }
  return { first, median: median(times), best: Math.min(...times), value }
}

// one approach, full grid; checked against a direct evaluation so the rate is of right answers
const one = approachAt(2)
const sweep = time(() => sweepApproach(one, ranges, limits), 9)
const points = sweep.value.points
for (const i of [0, 1000, points.length - 1]) {
  const s = points[i].settings
  const r = evaluateApproach({ ...one, priority: { ...one.priority, strategy: s.strategy, maxExtensionS: s.maxExtensionS, maxEarlyGreenS: s.maxEarlyGreenS, lockoutCycles: s.lockoutCycles, lateOnly: s.lateOnly } })
  if (Math.abs(r.personDelayBalanceS - points[i].personDelayBalanceS) > 1e-6 * Math.max(1, Math.abs(r.personDelayBalanceS))) throw new Error('a sweep point differs from the model')
}
const direct = time(() => evaluateApproach(one), 50)
console.log(`Sweep of one approach: ${points.length} points (${sweepPointCount(ranges)} expected), ${sweep.value.runs} exact model runs`)
console.log(`  first ${sweep.first.toFixed(1)} ms, then median ${sweep.median.toFixed(1)} ms, best ${sweep.best.toFixed(1)} ms`)
console.log(`  (one direct evaluation: median ${direct.median.toFixed(3)} ms, so point by point would take about ${((direct.median * points.length) / 1000).toFixed(2)} s)`)

const corridor = Array.from({ length: 30 }, (_, a) => approachAt(a))
const single = time(() => corridor.map((input) => recommendApproach(input, ranges, limits, 'person-delay').recommendation), 5)
const feasible = single.value.filter((r) => r.feasible).length
const binding = single.value.filter((r) => r.binding.length).length
console.log(`Recommendations for a 30-approach corridor, one period: ${feasible} feasible, ${binding} with a binding limit`)
console.log(`  first ${single.first.toFixed(0)} ms, then median ${single.median.toFixed(0)} ms, best ${single.best.toFixed(0)} ms (target < 2000 ms)`)

const loads = [0.55, 0.8, 0.65, 0.9]
const periods = corridor.map((_, a) => loads.map((load, k) => ({ label: `period ${k + 1}`, input: approachAt(a, load), hours: [2, 6, 3, 4][k], trips: [24, 36, 27, 32][k] })))
const day = time(() => periods.map((ps) => recommendPeriods(ps, ranges, limits, 'person-delay')), 3)
console.log(`Recommendations for the corridor over four periods each (one setting per row): median ${day.median.toFixed(0)} ms, first ${day.first.toFixed(0)} ms`)
if (single.median >= 2000) process.exitCode = 1

// Model speed: Godunov cell updates per second, and one corridor evaluated with the exact solver
// (30 approaches x 4 periods x 2 scenarios, 1 s arrival-phase resolution). Targets: >= 20 million
// updates/s; the corridor under 50 ms.
import { performance } from 'node:perf_hooks'
import {
  type Diagram, capacity, evaluateApproaches, fixedTimePlan, freeDensity, greenshields, newStepFlows, openShares, step,
  stableDt, triangularFromWaveSpeed,
} from '../shared/model'
import { approachBody, type ApproachInput } from '../shared/schemas/model'

function godunovRate(d: Diagram, cells: number, steps: number): number {
  const dx = 2
  const dt = stableDt(d, dx, 0.9)
  const k = new Float64Array(cells).fill(freeDensity(d, 0.6 * capacity(d)))
  const plan = fixedTimePlan(60, 30, 0, Math.ceil((steps * dt) / 60) + 1)
  const open = openShares(plan, 0, dt, steps)
  const bc = { inflowDemand: 0.6 * capacity(d), outflowSupply: capacity(d), signalInterface: Math.floor(cells * 0.7), signalOpen: 1 }
  const flows = newStepFlows()
  const t0 = performance.now()
  for (let m = 0; m < steps; m++) {
    bc.signalOpen = open[m]
    step(d, k, dt, dx, bc, flows)
  }
  const s = (performance.now() - t0) / 1000
  // a rate on a broken field would mean nothing
  if (!k.every((x) => Number.isFinite(x) && x >= -1e-12 && x <= d.kj + 1e-12)) throw new Error('density left [0, kj]')
  return (cells * steps) / s
}

/** A deterministic spread of invented approaches: flows, timings and bus stops vary by index. */
function corridor(): ApproachInput[] {
  const out: ApproachInput[] = []
  const periods = [0.55, 0.8, 0.65, 0.9]
  const positions = ['none', 'near-side', 'far-side'] as const
  for (let a = 0; a < 30; a++) {
    for (let p = 0; p < 4; p++) {
      for (let s = 0; s < 2; s++) {
        const cycle = [60, 80, 90, 100, 120][a % 5]
        const green = Math.round(cycle * (0.45 + 0.1 * ((a * 7) % 3) / 2))
        const lanes = 1 + (a % 2)
        const flow = periods[p] * 1800 * lanes * (green / cycle)
        out.push(approachBody.parse({
          approach: { lengthM: 250 + 25 * (a % 9), downstreamLengthM: 120, lanes, arrivalFlowVehPerHour: Math.round(flow) },
          signal: { cycleS: cycle, effectiveGreenS: green },
          bus: { stop: { position: positions[a % 3], distanceM: 25 + (a % 4) * 10, dwellS: 10 + (a % 5) * 5 } },
          priority: s === 0
            ? { strategy: 'green-extension', maxExtensionS: 8 }
            : { strategy: 'both', maxExtensionS: 10, maxEarlyGreenS: 8, lockoutCycles: 2 },
          crossStreet: { arrivalFlowVehPerHour: 300 + 40 * (a % 6), minGreenS: 8, pedWalkS: 7, pedClearanceS: Math.min(12, cycle - green - 15) },
        }))
      }
    }
  }
  return out
}

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b)
  return s[Math.floor(s.length / 2)]
}

const triangle = triangularFromWaveSpeed({ freeFlowSpeedKmh: 60, backwardWaveSpeedKmh: 20, jamDensityVehPerKmPerLane: 120 })
const green = greenshields({ freeFlowSpeedKmh: 60, jamDensityVehPerKmPerLane: 120 })
godunovRate(triangle, 1000, 2000)
godunovRate(green, 1000, 2000)
const triRate = Math.max(...[0, 1, 2].map(() => godunovRate(triangle, 2000, 10_000)))
const greenRate = Math.max(...[0, 1, 2].map(() => godunovRate(green, 2000, 10_000)))
console.log(`Godunov, triangular (CTM):  ${(triRate / 1e6).toFixed(1)} million cell updates/s (target >= 20)`)
console.log(`Godunov, Greenshields:      ${(greenRate / 1e6).toFixed(1)} million cell updates/s (target >= 20)`)

const inputs = corridor()
let t0 = performance.now()
const results = evaluateApproaches(inputs)
const cold = performance.now() - t0
const times: number[] = []
for (let r = 0; r < 9; r++) {
  t0 = performance.now()
  evaluateApproaches(inputs)
  times.push(performance.now() - t0)
}
const phases = results.reduce((n, r) => n + r.delayByArrivalPhase.length, 0)
console.log(`Corridor: ${inputs.length} evaluations (30 approaches x 4 periods x 2 scenarios), ${phases} arrival phases at 1 s, exact solver`)
console.log(`  first run ${cold.toFixed(1)} ms, then median ${median(times).toFixed(1)} ms, best ${Math.min(...times).toFixed(1)} ms (target < 50 ms)`)

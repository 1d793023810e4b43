// The trade-off sweep behind POST /api/model/sweep: the approach body checked as the model checks
// it, the city's limits (and any given in the body) to mark the points against, the recommendation
// and the settings to mark on the curve.
import type { Db } from '../db'
import { NotFound, Unprocessable } from '../errors'
import { checkApproach } from '../../shared/model'
import { sweepEvaluator, sweepGrid, withSettings } from '../../shared/model/sweep'
import { recommend, recommendOptions } from '../../shared/model/recommend'
import type { ApproachInput } from '../../shared/schemas/model'
import { NO_CITY_LIMITS, type CityLimits } from '../../shared/schemas/city-limits'
import { SWEEP_CAUTION, type SweepInput, type SweepResponse, type SweepSettings } from '../../shared/schemas/sweep'
import { getCityLimits } from './city-limits'

export const NO_PRIORITY: SweepSettings = { strategy: 'none', maxExtensionS: 0, maxEarlyGreenS: 0, lockoutCycles: 0, lateOnly: false }

/** Refuses an approach the model cannot sweep, naming the field (422). */
export function assertSweepable(input: ApproachInput, prefix: (string | number)[] = []): void {
  if (input.diagram.kind !== 'triangular') {
    throw new Unprocessable('The sweep needs the triangular diagram.', [{ path: [...prefix, 'diagram', 'kind'], message: 'The sweep runs the exact solver, which works on the triangular diagram only.' }])
  }
  const broken = checkApproach(withSettings(input, NO_PRIORITY))
  if (broken.length) {
    throw new Unprocessable('These settings break a constraint of the signal or the approach.', broken.map((v) => ({ path: [...prefix, ...v.field.split('.')], message: v.reason })))
  }
}

async function limitsFor(db: Db, body: SweepInput): Promise<CityLimits> {
  let base = NO_CITY_LIMITS
  if (body.cityId !== undefined) {
    try {
      const { orgId: _o, cityName: _n, version: _v, updatedAt: _a, updatedBy: _b, ...limits } = await getCityLimits(db, body.cityId)
      base = limits
    } catch (err) {
      if (err instanceof NotFound) throw new Unprocessable('No such city.', [{ path: ['cityId'], message: `No city with id "${body.cityId}".` }])
      throw err
    }
  }
  return { ...base, ...(body.limits ?? {}) }
}

export async function runSweep(db: Db, body: SweepInput): Promise<SweepResponse> {
  const { ranges, limits: _l, cityId: _c, objective, marks, ...input } = body
  assertSweepable(input)
  const limits = await limitsFor(db, body)
  const ev = sweepEvaluator(input, limits)
  const points = sweepGrid(ranges).map((s) => ev.point(s))
  const recommendation = recommend(
    [{ label: 'this period', points, personWeight: 1, busWeight: 1, availableGreenS: ev.baseline.availableGreenS }],
    recommendOptions(ranges, limits, objective),
  )
  return {
    points,
    marked: marks.map((m) => ({ label: m.label, point: ev.point(m.settings) })),
    recommendation,
    baseline: ev.baseline,
    limits,
    caution: SWEEP_CAUTION,
  }
}

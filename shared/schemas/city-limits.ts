// What a city accepts from priority at its signals, set once per city (GET/PUT
// /api/cities/:orgId/limits). The recommender keeps every suggestion inside these limits and
// inside the hard minimums of the timing (cross-street minimum green, pedestrian walk + clearance).
import { z } from 'zod'
import { LOS_GRADES, type LosGrade } from './model'
import { MAX_LIMIT_S, MAX_LOCKOUT_CYCLES } from './proposals'

// The v/c and LOS limits bound what priority does: a cross street already past a limit without
// priority may not get any worse with it (the timing itself is the city's to change).
export const cityLimitsSchema = z.strictObject({
  /** Highest cross-street volume-to-capacity ratio after priority; null: no limit. */
  maxCrossVc: z.number().min(0.3).max(1.5).nullable(),
  /** Worst acceptable cross-street level of service after priority; null: no limit. */
  worstLos: z.enum(LOS_GRADES).nullable(),
  maxExtensionS: z.number().min(0).max(MAX_LIMIT_S).nullable(),
  maxEarlyGreenS: z.number().min(0).max(MAX_LIMIT_S).nullable(),
  /** Minimum recovery: cycles without another grant after one (the lockout). */
  minLockoutCycles: z.int().min(0).max(MAX_LOCKOUT_CYCLES),
})
export type CityLimits = z.infer<typeof cityLimitsSchema>

/** PUT body: the limits and the version read (two engineers editing at once never both win). */
export const cityLimitsPutBody = cityLimitsSchema.extend({ version: z.int().min(0) })
export type CityLimitsPutBody = z.infer<typeof cityLimitsPutBody>

export const cityParams = z.object({ orgId: z.string().min(1).max(100) })

/** No limit beyond the hard minimums of the timing. */
export const NO_CITY_LIMITS: CityLimits = { maxCrossVc: null, worstLos: null, maxExtensionS: null, maxEarlyGreenS: null, minLockoutCycles: 0 }

export interface CityLimitsDto extends CityLimits {
  orgId: string
  cityName: string
  /** 0 while the city has not set its own limits (the defaults are shown). */
  version: number
  updatedAt: string | null
  updatedBy: { id: string; name: string } | null
}

export const LOS_RANK: Record<LosGrade, number> = { A: 0, B: 1, C: 2, D: 3, E: 4, F: 5 }

export const CONSTRAINTS = ['min-green', 'ped-walk-clearance', 'max-vc', 'worst-los', 'max-extension', 'max-early-green', 'min-lockout'] as const
export type ConstraintKind = (typeof CONSTRAINTS)[number]

/** Hard minimums of the timing that no setting may break, whatever the city's limits. */
export const HARD_CONSTRAINTS: readonly ConstraintKind[] = ['min-green', 'ped-walk-clearance']

export function constraintLabel(kind: ConstraintKind, limits: CityLimits): string {
  switch (kind) {
    case 'min-green': return 'the cross street’s minimum green'
    case 'ped-walk-clearance': return 'pedestrian walk + clearance'
    case 'max-vc': return `the city’s maximum cross-street v/c (${limits.maxCrossVc?.toFixed(2)})`
    case 'worst-los': return `the city’s worst acceptable level of service (${limits.worstLos})`
    case 'max-extension': return `the city’s maximum extension (${limits.maxExtensionS} s)`
    case 'max-early-green': return `the city’s maximum early green (${limits.maxEarlyGreenS} s)`
    case 'min-lockout': return `the city’s minimum recovery (${limits.minLockoutCycles} cycle${limits.minLockoutCycles === 1 ? '' : 's'} of lockout)`
  }
}

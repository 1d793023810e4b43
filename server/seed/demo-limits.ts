import type { Db } from '../db'
import { cityLimits } from '../db/schema'
import type { CityLimits } from '../../shared/schemas/city-limits'

// What the two invented cities accept, in the usual ranges of practice: limits of about 10-15 s
// and a lockout of 1-2 cycles (common practice). Osterfield is the stricter of the two.
export const DEMO_CITY_LIMITS: Record<'org-brackenford' | 'org-osterfield', CityLimits> = {
  'org-brackenford': { maxCrossVc: 0.9, worstLos: 'D', maxExtensionS: 12, maxEarlyGreenS: 10, minLockoutCycles: 1 },
  'org-osterfield': { maxCrossVc: 0.85, worstLos: 'C', maxExtensionS: 10, maxEarlyGreenS: 8, minLockoutCycles: 2 },
}

/** Idempotent: a city that has set its own limits keeps them. */
export async function seedDemoLimits(db: Db): Promise<void> {
  await db.insert(cityLimits).values(Object.entries(DEMO_CITY_LIMITS).map(([orgId, l]) => ({ orgId, ...l }))).onConflictDoNothing()
}

import type { Db } from '../db'
import { organisations, users } from '../db/schema'
import { hashPassword } from '../auth/password'
import { DEMO_ORGANISATIONS, DEMO_USERS } from './demo-people'
import { seedDemoProposal } from './demo-proposal'
import { seedDemoFeed } from './demo-feed'
import { seedDemoLimits } from './demo-limits'
import { seedDemoSignals } from './demo-signals'
import { seedDemoSavingsInputs } from './demo-savings-inputs'

export interface SeedOptions {
  password: string
}

/**
 * Seeds the invented demo scenario. Idempotent: rows that exist are left as they are, so a
 * restart never duplicates or resets the demo. Later steps (feed, corridor, proposal) add to it.
 */
export async function seedDemo(db: Db, options: SeedOptions): Promise<void> {
  await db.insert(organisations).values([...DEMO_ORGANISATIONS]).onConflictDoNothing()
  const passwordHash = await hashPassword(options.password)
  await db.insert(users).values(DEMO_USERS.map((u) => ({ ...u, passwordHash }))).onConflictDoNothing()
  const feedId = await seedDemoFeed(db)
  await seedDemoSignals(db, feedId)
  await seedDemoLimits(db)
  await seedDemoSavingsInputs(db)
  // After the feed, the signals and the demo corridor: a no-op until they exist.
  await seedDemoProposal(db)
}

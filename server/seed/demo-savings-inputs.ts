import type { Db } from '../db'
import { savingsInputs } from '../db/schema'
import type { SavingsInputs } from '../../shared/schemas/savings'

// The invented agency's own figures for the savings: fuller buses on the trunk route in the
// peaks, a cost per revenue-hour and a layover share of the usual order (common practice:
// layover and recovery of 10-15% of the round trip). Invented for the demo.
export const DEMO_SAVINGS_INPUTS: SavingsInputs = {
  defaultLoad: 24,
  loads: [
    { routeId: '7', periodName: 'AM peak', passengers: 46 },
    { routeId: '7', periodName: 'PM peak', passengers: 42 },
    { routeId: '7', periodName: null, passengers: 28 },
    { routeId: '17', periodName: null, passengers: 35 },
  ],
  costPerRevenueHour: 128,
  currency: 'EUR',
  costYear: 2026,
  layoverShare: 0.12,
}

/** Idempotent: agency defaults the planners have set are kept. */
export async function seedDemoSavingsInputs(db: Db): Promise<void> {
  await db.insert(savingsInputs).values({ id: 'demo-savings-inputs', agencyId: 'org-lindenmere', corridorId: null, ...DEMO_SAVINGS_INPUTS }).onConflictDoNothing()
}

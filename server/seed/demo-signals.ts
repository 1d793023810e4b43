// The demo's signals and its corridor: the ten invented intersections of Kestrel Avenue and
// Harbour Road with their timing plans (sample-feeds/lindenmere-signals.csv), and the corridor
// "Kestrel Avenue eastbound" (routes 7 and 17, direction 0) with its approaches
// (sample-feeds/kestrel-avenue-eastbound-approaches.csv), both read by the real CSV imports.
// Idempotent: signals are imported only while the demo cities have none, the corridor only while
// no corridor has its name.
import { readFile } from 'node:fs/promises'
import { fileURLToPath } from 'node:url'
import { eq, inArray } from 'drizzle-orm'
import type { User } from 'lucia'
import type { Db } from '../db'
import { corridors, intersections, users } from '../db/schema'
import { importSignalsCsv } from '../services/signals/signals-csv'
import { createCorridor } from '../services/corridors/corridors'
import { importApproachesCsv } from '../services/corridors/approaches-csv'
import { DEMO_CORRIDOR_NAME } from './demo-proposal'

const sample = (name: string) => fileURLToPath(new URL(`../../sample-feeds/${name}`, import.meta.url))
const DEMO_CITIES = ['org-brackenford', 'org-osterfield']

async function actor(db: Db, id: string): Promise<User> {
  const [u] = await db.select().from(users).where(eq(users.id, id))
  return { id: u.id, email: u.email, name: u.name, role: u.role, organisationId: u.organisationId, active: u.active }
}

export async function seedDemoSignals(db: Db, feedId: number): Promise<void> {
  const [anySignal] = await db.select({ id: intersections.id }).from(intersections).where(inArray(intersections.jurisdictionId, DEMO_CITIES)).limit(1)
  // The admin imports both cities' files at once; in use each city's engineers import their own.
  if (!anySignal) await importSignalsCsv(db, await actor(db, 'user-admin'), await readFile(sample('lindenmere-signals.csv'), 'utf8'))

  const [existing] = await db.select({ id: corridors.id }).from(corridors).where(eq(corridors.name, DEMO_CORRIDOR_NAME))
  if (existing) return
  const planner = await actor(db, 'user-planner')
  const corridor = await createCorridor(db, planner, { feedId, name: DEMO_CORRIDOR_NAME, routeIds: ['7', '17'], directionId: 0 })
  await importApproachesCsv(db, planner, corridor.id, await readFile(sample('kestrel-avenue-eastbound-approaches.csv'), 'utf8'))
}

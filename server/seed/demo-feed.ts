import { fileURLToPath } from 'node:url'
import { and, eq } from 'drizzle-orm'
import type { Db } from '../db'
import { feedVersions } from '../db/schema'
import { importFeedFromFile } from '../services/gtfs/import'

export const DEMO_FEED_NAME = 'Lindenmere Regional Transit (demo feed)'
const DEMO_FEED_PATH = fileURLToPath(new URL('../../sample-feeds/lindenmere-gtfs.zip', import.meta.url))

/**
 * Imports the invented demo feed (sample-feeds/lindenmere-gtfs.zip) through the real import,
 * once: a ready demo feed already there is left alone. Returns its feed version id.
 */
export async function seedDemoFeed(db: Db): Promise<number> {
  const [existing] = await db.select({ id: feedVersions.id }).from(feedVersions)
    .where(and(eq(feedVersions.organisationId, 'org-lindenmere'), eq(feedVersions.name, DEMO_FEED_NAME), eq(feedVersions.state, 'ready')))
  if (existing) return existing.id
  const result = await importFeedFromFile(db, { organisationId: 'org-lindenmere', userId: 'user-planner', name: DEMO_FEED_NAME, path: DEMO_FEED_PATH })
  return result.feedId
}

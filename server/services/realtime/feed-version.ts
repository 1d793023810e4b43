import { and, desc, eq } from 'drizzle-orm'
import type { User } from 'lucia'
import type { Db } from '../../db'
import { feedVersions } from '../../db/schema'
import { Conflict, Forbidden, NotFound } from '../../errors'

/**
 * The feed version realtime data is matched against: the one asked for, which must be ready and
 * (except for an admin) the user's own agency's, or else the agency's latest ready feed.
 */
export async function resolveFeedVersion(db: Db, user: User, requested: number | undefined): Promise<{ id: number; organisationId: string }> {
  if (requested !== undefined) {
    const [fv] = await db.select({ id: feedVersions.id, organisationId: feedVersions.organisationId, state: feedVersions.state })
      .from(feedVersions).where(eq(feedVersions.id, requested))
    if (!fv) throw new NotFound('Feed version')
    if (user.role !== 'admin' && fv.organisationId !== user.organisationId) throw new Forbidden('That feed belongs to another agency.')
    if (fv.state !== 'ready') throw new Conflict(`Feed version ${requested} is ${fv.state}; realtime data needs an imported feed.`)
    return fv
  }
  const [latest] = await db.select({ id: feedVersions.id, organisationId: feedVersions.organisationId }).from(feedVersions)
    .where(and(eq(feedVersions.organisationId, user.organisationId), eq(feedVersions.state, 'ready')))
    .orderBy(desc(feedVersions.uploadedAt), desc(feedVersions.id)).limit(1)
  if (!latest) throw new Conflict('Import a GTFS feed first: realtime data is matched against its trips.')
  return latest
}

// Uploaded snapshot batches: small ones are ingested while the request waits, large ones become a
// job the client follows (GET /api/jobs/:id), whose result is the same summary and file list.
import type { User } from 'lucia'
import type { Db } from '../../db'
import type { Clock } from '../../clock'
import { BadRequest } from '../../errors'
import { createJob, runJob } from '../jobs'
import { collectFiles, type UploadedFile } from './archive'
import { ingestBatch } from './ingest'
import { resolveFeedVersion } from './feed-version'
import type { RealtimeUploadResultDto } from '../../../shared/schemas/realtime'

/** Batches up to this many files are answered at once. */
export const INLINE_FILE_LIMIT = 25

export async function uploadSnapshots(
  db: Db, clock: Clock, user: User, uploads: UploadedFile[], requestedFeedVersion: number | undefined,
): Promise<RealtimeUploadResultDto> {
  if (uploads.length === 0) throw new BadRequest('Attach one or more .pb files, or a zip of them, in the form field "files".')
  const feed = await resolveFeedVersion(db, user, requestedFeedVersion)
  const files = collectFiles(uploads)
  const opts = { db, clock, feedVersionId: feed.id, uploadedBy: user.id }
  if (files.length <= INLINE_FILE_LIMIT) {
    return { feedVersionId: feed.id, ...(await ingestBatch(opts, files)) }
  }
  const jobId = await createJob(db, 'realtime-upload', user.id)
  void runJob(db, jobId, async (report) => {
    await report({ stage: 'reading snapshots', progress: 0 })
    const out = await ingestBatch({ ...opts, onProgress: (done, total) => report({ stage: `snapshot ${done} of ${total}`, progress: done / total }) }, files)
    return { feedVersionId: feed.id, ...out }
  })
  return { feedVersionId: feed.id, jobId, files: files.length }
}

// importFeedFromFile: the whole import of one GTFS zip, used by the upload job and the demo seed.
// 1. stage: read, check and derive everything, rows to scratch CSV files (database untouched);
// 2. if any error: the feed version is marked failed with its report, no GTFS row is written;
// 3. else store: one transaction loads and attaches every table and marks the feed ready.
import { mkdtemp, rm } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import path from 'node:path'
import type { Db } from '../../db'
import { feedVersions } from '../../db/schema'
import type { ReportProgress } from '../jobs'
import { isoDate } from '../../../shared/gtfs/date'
import type { FeedCountsDto, FeedDerivedDto, FeedReportDto } from '../../../shared/schemas/gtfs'
import { Findings, describeFinding } from './findings'
import { DEFAULT_GTFS_LIMITS, type GtfsLimits } from './limits'
import { stageFeed } from './stage'
import { markFeed, storeFeed, type FeedSummary } from './store'
import type { FeedState } from './feed-state'

export interface ImportInput {
  organisationId: string
  userId: string | null
  name: string
  /** The zip on disk. */
  path: string
  /** An existing feed_versions row in state 'importing' (the upload route creates it first). */
  feedId?: number
  jobId?: string | null
  limits?: Partial<GtfsLimits>
}

export interface ImportResult {
  feedId: number
  counts: FeedCountsDto
  derived: FeedDerivedDto
  errorCount: number
  warningCount: number
}

/** A feed that did not pass; `result` goes to the job, the report to the feed version. */
export class GtfsImportError extends Error {
  constructor(message: string, readonly result: { feedId: number; errorCount: number; warningCount: number }) {
    super(message)
  }
}

const noProgress: ReportProgress = async () => {}

export async function createFeedVersion(db: Db, input: Pick<ImportInput, 'organisationId' | 'userId' | 'name' | 'jobId'>): Promise<number> {
  const [row] = await db.insert(feedVersions)
    .values({ organisationId: input.organisationId, uploadedBy: input.userId, name: input.name, jobId: input.jobId ?? null })
    .returning({ id: feedVersions.id })
  return row.id
}

export async function importFeedFromFile(db: Db, input: ImportInput, report: ReportProgress = noProgress): Promise<ImportResult> {
  const limits = { ...DEFAULT_GTFS_LIMITS, ...input.limits }
  const feedId = input.feedId ?? await createFeedVersion(db, input)
  const findings = new Findings(limits.maxFindingsPerKind)
  const workDir = await mkdtemp(path.join(tmpdir(), 'fanlight-import-'))
  let st: FeedState | null = null
  try {
    await report({ stage: 'reading the archive', progress: 0.01 })
    st = await stageFeed({
      path: input.path, feedId, workDir, limits, findings,
      // Reading is about three quarters of the work; storing (no progress inside) the rest.
      progress: (stage, fraction) => report({ stage, progress: 0.02 + 0.73 * Math.min(1, fraction) }),
    })
    if (!st || findings.errorCount > 0) {
      await markFeed(db.$client, feedId, 'failed', { ...summarise(st, findings.toReport()), serviceStart: null, serviceEnd: null })
      throw failure(feedId, findings)
    }
    await report({ stage: 'writing to the database', progress: 0.78 })
    const summary = summarise(st, findings.toReport())
    await storeFeed(db.$client, st, summary)
    return { feedId, counts: summary.counts, derived: summary.derived, errorCount: 0, warningCount: findings.warningCount }
  } catch (err) {
    if (err instanceof GtfsImportError) throw err
    // Anything unexpected (a bug, the disk, the database) still ends as a readable failure.
    findings.error('import_stopped', { file: '(import)', message: `The import stopped: ${(err as Error).message}` })
    await markFeed(db.$client, feedId, 'failed', summarise(st, findings.toReport())).catch(() => {})
    throw failure(feedId, findings)
  } finally {
    st?.disposeWriters()
    await rm(workDir, { recursive: true, force: true })
  }
}

function failure(feedId: number, findings: Findings): GtfsImportError {
  const first = findings.first()
  const n = findings.errorCount
  const message = first
    ? `The feed was not imported: ${describeFinding(first)}${n > 1 ? ` (${n} errors in all; see the report)` : ''}`
    : 'The feed was not imported.'
  return new GtfsImportError(message, { feedId, errorCount: n, warningCount: findings.warningCount })
}

function summarise(st: FeedState | null, report: FeedReportDto): FeedSummary {
  const rows = (t: keyof FeedState['writers']) => st?.writers[t].rows ?? 0
  return {
    counts: {
      agency: rows('gtfs_agency'), routes: rows('gtfs_routes'), trips: rows('gtfs_trips'), stops: rows('gtfs_stops'),
      stop_times: rows('gtfs_stop_times'), shapes: rows('gtfs_shapes'), calendar: rows('gtfs_calendar'),
      calendar_dates: rows('gtfs_calendar_dates'), frequencies: rows('gtfs_frequencies'),
    },
    derived: {
      serviceDates: rows('gtfs_service_dates'),
      frequencyTrips: rows('gtfs_frequency_trips'),
      interpolatedStopTimes: st?.interpolatedStopTimes ?? 0,
    },
    report,
    serviceStart: st?.serviceStart != null ? isoDate(st.serviceStart) : null,
    serviceEnd: st?.serviceEnd != null ? isoDate(st.serviceEnd) : null,
  }
}

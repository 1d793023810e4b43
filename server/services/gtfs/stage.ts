// Reads and checks a whole feed without touching the database: files in the order their
// references need, findings gathered, rows written to scratch CSV files for COPY.
import { GTFS_FILE_NAMES, type GtfsFileName } from '../../../shared/schemas/gtfs'
import { ArchiveError, openZip, type InflateBudget, type ZipArchive, type ZipEntry } from './zip'
import { FeedState } from './feed-state'
import type { Findings } from './findings'
import type { GtfsLimits } from './limits'
import type { ReadContext, ReadOutcome } from './read-file'
import { readAgency, readRoutes, readStops } from './agency-stops-routes'
import { readCalendar, readCalendarDates, writeServiceDates } from './calendar-files'
import { readShapes } from './shapes'
import { readTrips } from './trips'
import { readStopTimes } from './stop-times'
import { readFrequencies } from './frequencies'
import { readFeedInfo } from './feed-info'

type Reader = (st: FeedState, ctx: ReadContext, entry: ZipEntry) => Promise<ReadOutcome>

/** Reading order: each file after the files it refers to. */
const READERS: { file: GtfsFileName; read: Reader; needs: GtfsFileName[] }[] = [
  { file: 'agency.txt', read: readAgency, needs: [] },
  { file: 'stops.txt', read: readStops, needs: [] },
  { file: 'routes.txt', read: readRoutes, needs: ['agency.txt'] },
  { file: 'calendar.txt', read: readCalendar, needs: [] },
  { file: 'calendar_dates.txt', read: readCalendarDates, needs: [] },
  { file: 'shapes.txt', read: readShapes, needs: [] },
  { file: 'trips.txt', read: readTrips, needs: ['routes.txt'] },
  { file: 'stop_times.txt', read: readStopTimes, needs: ['trips.txt', 'stops.txt'] },
  { file: 'frequencies.txt', read: readFrequencies, needs: ['stop_times.txt'] },
  { file: 'feed_info.txt', read: readFeedInfo, needs: [] },
]
const REQUIRED: GtfsFileName[] = ['agency.txt', 'stops.txt', 'routes.txt', 'trips.txt', 'stop_times.txt']
const ARCHIVE = '(zip archive)'

export interface StageOptions {
  path: string
  feedId: number
  workDir: string
  limits: GtfsLimits
  findings: Findings
  /** Stage name and the share of the reading done (0..1). */
  progress: (stage: string, fraction: number) => Promise<void>
}

/** The checked feed ready for storing, or null when the archive itself could not be read. */
export async function stageFeed(o: StageOptions): Promise<FeedState | null> {
  const { findings } = o
  let zip: ZipArchive
  try {
    zip = await openZip(o.path, o.limits)
  } catch (err) {
    if (err instanceof ArchiveError) { archiveFinding(findings, err); return null }
    throw err
  }
  const entries = locateFiles(zip.entries)
  const missing = REQUIRED.filter((f) => !entries.has(f))
  for (const file of missing) findings.error('missing_file', { file, message: `The feed has no ${file}, which GTFS requires.` })
  if (!entries.has('calendar.txt') && !entries.has('calendar_dates.txt')) {
    findings.error('missing_file', { file: 'calendar.txt', message: 'The feed needs calendar.txt, calendar_dates.txt or both to say when its services run.' })
  }
  if (findings.errorCount > 0) return null

  const st = new FeedState(o.feedId, o.workDir, findings)
  const budget: InflateBudget = { used: 0, max: o.limits.maxUncompressedBytes }
  const total = READERS.reduce((s, r) => s + (entries.get(r.file)?.size ?? 0), 0) || 1
  let done = 0
  const broken = new Set<GtfsFileName>()
  const rowsOf = new Map<GtfsFileName, number>()
  try {
    for (const { file, read, needs } of READERS) {
      const entry = entries.get(file)
      if (!entry) continue
      if (needs.some((n) => broken.has(n))) { broken.add(file); continue }
      await o.progress(`checking ${file}`, done / total)
      const ctx: ReadContext = { zip, budget, findings, onBytes: (n) => o.progress(`checking ${file}`, (done + n) / total) }
      const out = await read(st, ctx, entry)
      done += entry.size
      rowsOf.set(file, out.rows)
      const required = REQUIRED.includes(file)
      if (out.empty) {
        if (required) findings.error('empty_file', { file, line: 1, message: 'The file is empty: it needs a header line and at least one row.' })
        else findings.warning('empty_file', { file, line: 1, message: 'The file is empty; it is ignored.' })
        broken.add(file)
      } else if (out.unusable) {
        broken.add(file)
      } else if (required && out.dataRows === 0) {
        findings.error('empty_file', { file, line: 2, message: 'The file has a header but no rows.' })
        broken.add(file)
      } else if (required && out.rows === 0) {
        // Every row was refused: checking the files that refer to it would only repeat that.
        broken.add(file)
      }
      if (file === 'stop_times.txt' && !broken.has(file)) usageWarnings(st)
      st.noteErrors()
    }
  } catch (err) {
    st.disposeWriters()
    if (err instanceof ArchiveError) { archiveFinding(findings, err); return null }
    throw err
  }
  if ((rowsOf.get('calendar.txt') ?? 0) + (rowsOf.get('calendar_dates.txt') ?? 0) === 0 && findings.errorCount === 0) {
    findings.error('empty_file', { file: 'calendar.txt', message: 'Neither calendar.txt nor calendar_dates.txt has a row: no service ever runs.' })
  }
  await o.progress('deriving service dates', 1)
  writeServiceDates(st)
  st.closeWriters()
  return st
}

function archiveFinding(findings: Findings, err: ArchiveError) {
  findings.error(err.kind, { file: err.entry ?? ARCHIVE, line: null, field: null, value: err.entry, message: err.message })
}

/**
 * GTFS files sit at the root of the archive; many tools zip the folder instead, so a single
 * folder holding agency.txt is accepted too. Other entries (and macOS metadata) are ignored.
 */
function locateFiles(entries: ZipEntry[]): Map<GtfsFileName, ZipEntry> {
  const names = new Set<string>(GTFS_FILE_NAMES)
  const usable = entries.filter((e) => !e.name.startsWith('__MACOSX/'))
  let base = ''
  if (!usable.some((e) => names.has(e.name))) {
    const agency = usable.find((e) => e.name.endsWith('/agency.txt'))
    if (agency) base = agency.name.slice(0, -'agency.txt'.length)
  }
  const out = new Map<GtfsFileName, ZipEntry>()
  for (const e of usable) {
    if (!e.name.startsWith(base)) continue
    const rest = e.name.slice(base.length)
    if (names.has(rest)) out.set(rest as GtfsFileName, e)
  }
  return out
}

function usageWarnings(st: FeedState) {
  const f = st.findings
  for (let i = 0; i < st.stopIds.length; i++) {
    if (st.stopType[i] === 0 && !st.stopUsed[i]) {
      f.warning('unused_stop', { file: 'stops.txt', field: 'stop_id', value: st.stopIds[i], message: `No trip serves the stop ${st.stopIds[i]}.` })
    }
  }
  for (const [id, i] of st.routeIndex) {
    if (!st.routeUsed[i]) f.warning('unused_route', { file: 'routes.txt', field: 'route_id', value: id, message: `The route ${id} has no trips.` })
  }
  for (let t = 0; t < st.tripIds.length; t++) {
    const n = st.tripStopTimes[t]
    if (n < 2) f.warning('short_trip', { file: 'trips.txt', field: 'trip_id', value: st.tripIds[t], message: n === 0 ? `The trip ${st.tripIds[t]} has no stop_times.` : `The trip ${st.tripIds[t]} has a single stop.` })
  }
  for (const id of st.shapes.keys()) {
    if (!st.shapeUsed.has(id)) f.warning('unused_shape', { file: 'shapes.txt', field: 'shape_id', value: id, message: `No trip uses the shape ${id}.` })
  }
}

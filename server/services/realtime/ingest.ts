// Stores decoded snapshots. Each file is one transaction: its snapshot row and every observation
// read from it go in together or not at all, and a bad file never stops the rest of a batch.
// A snapshot whose header time and content hash are already stored for the feed version is a
// duplicate: counted and skipped. Entities whose trip the feed version does not know are counted
// (with a sample of their trip ids) instead of being stored.
import type { Db } from '../../db'
import type { Clock } from '../../clock'
import type { CollectedFile } from './archive'
import { decodeSnapshot, DEFAULT_TIME_LIMITS, RealtimeFileError, type DecodedSnapshot, type TimeLimits } from './decode'
import { resolveTripUpdate } from './stop-events'
import { serviceDayStart } from './service-day'
import { tripIndexFor, type TripIndex } from './trip-index'
import type { RealtimeFileResultDto, RealtimeIngestSummaryDto } from '../../../shared/schemas/realtime'

export interface IngestOptions {
  db: Db
  clock: Clock
  feedVersionId: number
  sourceId?: string | null
  uploadedBy?: string | null
  limits?: TimeLimits
  onProgress?: (done: number, total: number) => Promise<void>
}

const UNMATCHED_SAMPLE = 20

const VEHICLE_COLUMNS = ['snapshot_id', 'feed_version_id', 'trip_id', 'service_date', 'start_time', 'vehicle_id', 'observed_s',
  'lat', 'lon', 'bearing', 'speed_mps', 'status', 'stop_id', 'stop_sequence'] as const
const STOP_COLUMNS = ['snapshot_id', 'feed_version_id', 'trip_id', 'service_date', 'stop_sequence', 'stop_id', 'reported_s',
  'arrival_s', 'departure_s', 'delay_s'] as const

/** A CSV field for COPY: empty is NULL, quoted only when it must be. */
function field(v: string | number | null): string {
  if (v === null) return ''
  if (typeof v === 'number') return String(v)
  if (v === '' ) return '""'
  return /[",\n\r]/.test(v) ? `"${v.replaceAll('"', '""')}"` : v
}

const isoDate = (d: string) => `${d.slice(0, 4)}-${d.slice(4, 6)}-${d.slice(6, 8)}`

interface Rows {
  /** Rows without their leading snapshot id, which is known only once the snapshot row exists. */
  vehicles: string[]
  stops: string[]
  unmatched: number
  unmatchedSample: string[]
}

async function matchRows(ix: TripIndex, snap: DecodedSnapshot): Promise<Rows> {
  const rows: Rows = { vehicles: [], stops: [], unmatched: 0, unmatchedSample: [] }
  const miss = (tripId: string | null) => {
    rows.unmatched++
    if (rows.unmatchedSample.length < UNMATCHED_SAMPLE && !rows.unmatchedSample.includes(tripId ?? '')) rows.unmatchedSample.push(tripId ?? '')
  }
  const fv = ix.feedVersionId
  for (const v of snap.vehicles) {
    if (v.tripId === null || !ix.has(v.tripId)) { miss(v.tripId); continue }
    const shift = ix.shiftFor(v.tripId, v.startTime)
    const date = await ix.serviceDate(v.tripId, v.startDate, v.timeS, shift)
    if (date === null) { miss(v.tripId); continue }
    rows.vehicles.push([fv, field(v.tripId), isoDate(date), field(v.startTime), field(v.vehicleId), v.timeS, v.lat, v.lon,
      field(v.bearing), field(v.speedMps), v.status, field(v.stopId), field(v.stopSequence)].join(','))
  }
  const matched = snap.tripUpdates.filter((u) => u.tripId !== null && ix.has(u.tripId))
  const schedules = await ix.schedules(matched.map((u) => u.tripId!))
  for (const u of snap.tripUpdates) {
    if (u.tripId === null || !ix.has(u.tripId)) { miss(u.tripId); continue }
    const shift = ix.shiftFor(u.tripId, u.startTime)
    const date = await ix.serviceDate(u.tripId, u.startDate, u.timeS, shift)
    if (date === null) { miss(u.tripId); continue }
    const dayStart = serviceDayStart(date, ix.timeZone) + shift
    for (const s of resolveTripUpdate(u, schedules.get(u.tripId) ?? [], dayStart)) {
      rows.stops.push([fv, field(u.tripId), isoDate(date), s.stopSequence, field(s.stopId), u.timeS,
        field(s.arrivalS), field(s.departureS), Math.round(s.delayS)].join(','))
    }
  }
  return rows
}

type StoreOutcome = { duplicate: true } | { duplicate: false; snapshotId: number }

async function store(opts: IngestOptions, fileName: string, snap: DecodedSnapshot, rows: Rows): Promise<StoreOutcome> {
  const client = opts.db.$client
  return client.transaction(async (tx) => {
    const inserted = await tx.query<{ id: number }>(`
      insert into realtime_snapshots (feed_version_id, source_id, file_name, header_time, content_hash, gtfs_realtime_version, bytes,
        entity_count, vehicle_count, trip_update_count, other_count, unmatched_count, unmatched_sample, uploaded_by)
      values ($1, $2, $3, to_timestamp($4), $5, $6, $7, $8, $9, $10, $11, $12, $13, $14)
      on conflict (feed_version_id, header_time, content_hash) do nothing
      returning id`,
    [opts.feedVersionId, opts.sourceId ?? null, fileName, snap.headerTimeS, snap.contentHash, snap.gtfsRealtimeVersion, snap.bytes,
      snap.entityCount, snap.vehicles.length, snap.tripUpdates.length, snap.otherEntities, rows.unmatched,
      JSON.stringify(rows.unmatchedSample), opts.uploadedBy ?? null])
    const id = inserted.rows[0]?.id
    if (id === undefined) return { duplicate: true as const }
    const copy = async (table: string, columns: readonly string[], lines: string[]) => {
      if (lines.length === 0) return
      const text = lines.map((l) => `${id},${l}`).join('\n') + '\n'
      await tx.query(`copy ${table} (${columns.join(', ')}) from '/dev/blob' with (format csv)`, [], { blob: new Blob([text]) })
    }
    await copy('realtime_vehicle_observations', VEHICLE_COLUMNS, rows.vehicles)
    await copy('realtime_stop_time_observations', STOP_COLUMNS, rows.stops)
    return { duplicate: false as const, snapshotId: id }
  })
}

/** Decodes, matches and stores one file; never throws for a problem of the file itself. */
export async function ingestFile(opts: IngestOptions, ix: TripIndex, name: string, data: Uint8Array): Promise<RealtimeFileResultDto> {
  let snap: DecodedSnapshot
  try {
    snap = decodeSnapshot(data, opts.clock, opts.limits ?? DEFAULT_TIME_LIMITS)
  } catch (err) {
    if (err instanceof RealtimeFileError) {
      return { file: name, status: 'error', error: { code: err.code, message: err.message, ...(err.field ? { field: err.field } : {}) } }
    }
    throw err
  }
  const rows = await matchRows(ix, snap)
  const base = {
    file: name,
    headerTime: new Date(snap.headerTimeS * 1000).toISOString(),
    entities: snap.entityCount,
    vehicles: snap.vehicles.length,
    tripUpdates: snap.tripUpdates.length,
    unmatched: rows.unmatched,
    unmatchedSample: rows.unmatchedSample,
  }
  try {
    const outcome = await store(opts, name, snap, rows)
    if (outcome.duplicate) return { ...base, status: 'duplicate' }
    return { ...base, status: 'stored', snapshotId: outcome.snapshotId, vehicleRows: rows.vehicles.length, stopTimeRows: rows.stops.length }
  } catch (err) {
    // The transaction rolled back: nothing of this file is stored.
    console.error(`realtime: storing ${name} failed`, err)
    return { ...base, status: 'error', error: { code: 'store_failed', message: 'The snapshot could not be stored; nothing of it was kept.' } }
  }
}

export function summarise(results: RealtimeFileResultDto[]): RealtimeIngestSummaryDto {
  const count = (s: RealtimeFileResultDto['status']) => results.filter((r) => r.status === s).length
  return {
    files: results.length,
    stored: count('stored'),
    duplicates: count('duplicate'),
    errors: count('error'),
    skipped: count('skipped'),
    unmatched: results.reduce((s, r) => s + (r.status === 'stored' ? r.unmatched ?? 0 : 0), 0),
    vehicleRows: results.reduce((s, r) => s + (r.vehicleRows ?? 0), 0),
    stopTimeRows: results.reduce((s, r) => s + (r.stopTimeRows ?? 0), 0),
  }
}

/** Ingests a collected batch in order, reporting progress; one result per file. */
export async function ingestBatch(opts: IngestOptions, files: CollectedFile[]): Promise<{ summary: RealtimeIngestSummaryDto; results: RealtimeFileResultDto[] }> {
  const ix = await tripIndexFor(opts.db, opts.feedVersionId)
  const results: RealtimeFileResultDto[] = []
  for (const [i, f] of files.entries()) {
    if ('data' in f) results.push(await ingestFile(opts, ix, f.name, f.data))
    else if ('skipped' in f) results.push({ file: f.name, status: 'skipped', note: f.skipped })
    else results.push({ file: f.name, status: 'error', error: f.error })
    if (opts.onProgress) await opts.onProgress(i + 1, files.length)
  }
  return { summary: summarise(results), results }
}

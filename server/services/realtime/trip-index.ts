// What the realtime intake needs to know of a feed version's schedule: which trip ids exist, when
// each runs (to place a reading without a start date on its service day), the agency's time zone
// and, for trip updates, the trip's stop times. Feed versions never change once imported, so an
// index is built once per database and feed version and kept.
import { sql } from 'drizzle-orm'
import type { Db } from '../../db'
import { addDays, localDate, serviceDayStart } from './service-day'
import type { ScheduledStop } from './stop-events'

interface TripSpan {
  serviceId: string
  firstS: number
  lastS: number
}

/** A trip that frequencies.txt repeats: one run per start time, its times shifted. */
interface FrequencyRun {
  startTime: number
  shiftS: number
}

const MAX_CACHED_SCHEDULES = 20_000
/** A reading this long before the first departure or after the last arrival is not that trip's. */
const SPAN_SLACK_BEFORE_S = 1800
const SPAN_SLACK_AFTER_S = 3 * 3600

export class TripIndex {
  private scheduleCache = new Map<string, ScheduledStop[]>()
  private serviceIds = new Map<string, Set<string>>()

  private constructor(
    private readonly db: Db,
    readonly feedVersionId: number,
    readonly timeZone: string,
    private readonly trips: Map<string, TripSpan>,
    private readonly frequencies: Map<string, FrequencyRun[]>,
  ) {}

  static async load(db: Db, feedVersionId: number): Promise<TripIndex> {
    const [agency] = (await db.execute<{ tz: string }>(sql`
      select agency_timezone as tz from gtfs_agency where feed_version_id = ${feedVersionId} order by agency_id limit 1`)).rows
    const spans = (await db.execute<{ trip_id: string; service_id: string; first_s: number; last_s: number }>(sql`
      select t.trip_id, t.service_id, min(st.departure_time) as first_s, max(st.arrival_time) as last_s
      from gtfs_trips t join gtfs_stop_times st on st.feed_version_id = t.feed_version_id and st.trip_id = t.trip_id
      where t.feed_version_id = ${feedVersionId}
      group by t.trip_id, t.service_id`)).rows
    const runs = (await db.execute<{ trip_id: string; start_time: number; shift_s: number }>(sql`
      select trip_id, start_time, shift_s from gtfs_frequency_trips where feed_version_id = ${feedVersionId}`)).rows
    const trips = new Map(spans.map((r) => [r.trip_id, { serviceId: r.service_id, firstS: Number(r.first_s), lastS: Number(r.last_s) }]))
    const frequencies = new Map<string, FrequencyRun[]>()
    for (const r of runs) {
      const list = frequencies.get(r.trip_id) ?? []
      list.push({ startTime: Number(r.start_time), shiftS: Number(r.shift_s) })
      frequencies.set(r.trip_id, list)
    }
    return new TripIndex(db, feedVersionId, agency?.tz ?? 'UTC', trips, frequencies)
  }

  has(tripId: string): boolean {
    return this.trips.has(tripId)
  }

  get tripCount(): number {
    return this.trips.size
  }

  /** Seconds to add to the template's times for a repeated trip's run ("HH:MM:SS" start_time). */
  shiftFor(tripId: string, startTime: string | null): number {
    const runs = this.frequencies.get(tripId)
    if (!runs || !startTime) return 0
    const m = /^(\d{1,3}):(\d\d):(\d\d)$/.exec(startTime)
    if (!m) return 0
    const s = Number(m[1]) * 3600 + Number(m[2]) * 60 + Number(m[3])
    return runs.find((r) => r.startTime === s)?.shiftS ?? 0
  }

  private async servicesOn(date: string): Promise<Set<string>> {
    let set = this.serviceIds.get(date)
    if (!set) {
      const iso = `${date.slice(0, 4)}-${date.slice(4, 6)}-${date.slice(6, 8)}`
      const rows = (await this.db.execute<{ service_id: string }>(sql`
        select service_id from gtfs_service_dates where feed_version_id = ${this.feedVersionId} and date = ${iso}`)).rows
      set = new Set(rows.map((r) => r.service_id))
      this.serviceIds.set(date, set)
    }
    return set
  }

  /**
   * The service day (YYYYMMDD) of a reading: the trip descriptor's start_date when given, else the
   * day (the local date or the one before, for trips past midnight) on which the trip runs and
   * whose schedule spans the reading. Null when no day fits: the entity is unmatched.
   */
  async serviceDate(tripId: string, startDate: string | null, timeS: number, shiftS = 0): Promise<string | null> {
    if (startDate !== null) return /^\d{8}$/.test(startDate) ? startDate : null
    const span = this.trips.get(tripId)
    if (!span) return null
    const today = localDate(timeS, this.timeZone)
    for (const date of [today, addDays(today, -1)]) {
      const start = serviceDayStart(date, this.timeZone)
      const inSpan = timeS >= start + span.firstS + shiftS - SPAN_SLACK_BEFORE_S && timeS <= start + span.lastS + shiftS + SPAN_SLACK_AFTER_S
      if (inSpan && (await this.servicesOn(date)).has(span.serviceId)) return date
    }
    return null
  }

  /** Stop times of many trips at once (one query per batch of trip updates). */
  async schedules(tripIds: string[]): Promise<Map<string, ScheduledStop[]>> {
    const missing = [...new Set(tripIds)].filter((id) => !this.scheduleCache.has(id) && this.trips.has(id))
    if (missing.length) {
      const rows = (await this.db.execute<{ trip_id: string; stop_sequence: number; stop_id: string; arrival_time: number; departure_time: number }>(sql`
        select trip_id, stop_sequence, stop_id, arrival_time, departure_time from gtfs_stop_times
        where feed_version_id = ${this.feedVersionId} and trip_id = any(${sql.param(missing)})
        order by trip_id, stop_sequence`)).rows
      if (this.scheduleCache.size + missing.length > MAX_CACHED_SCHEDULES) this.scheduleCache.clear()
      for (const id of missing) this.scheduleCache.set(id, [])
      for (const r of rows) {
        this.scheduleCache.get(r.trip_id)!.push({ stopSequence: Number(r.stop_sequence), stopId: r.stop_id, arrivalS: Number(r.arrival_time), departureS: Number(r.departure_time) })
      }
    }
    return new Map(tripIds.map((id) => [id, this.scheduleCache.get(id) ?? []]))
  }
}

const indexes = new WeakMap<Db, Map<string, Promise<TripIndex>>>()

/**
 * The index of a ready feed version, built on first use. Keyed by id and upload time: ids restart
 * when a test empties the tables, upload times do not repeat.
 */
export async function tripIndexFor(db: Db, feedVersionId: number): Promise<TripIndex> {
  const [fv] = (await db.execute<{ uploaded_at: string }>(sql`
    select uploaded_at::text from feed_versions where id = ${feedVersionId} and state = 'ready'`)).rows
  if (!fv) throw new Error(`feed version ${feedVersionId} is not a ready feed`)
  const key = `${feedVersionId}@${fv.uploaded_at}`
  let perDb = indexes.get(db)
  if (!perDb) { perDb = new Map(); indexes.set(db, perDb) }
  let ix = perDb.get(key)
  if (!ix) {
    const loading = TripIndex.load(db, feedVersionId)
    loading.catch(() => perDb.delete(key))
    perDb.set(key, loading)
    ix = loading
  }
  return ix
}

// What the checks of one file need from the files read before it: identifiers, coordinates,
// shapes, and flags for the "never used" warnings. Kept compact (indexes and arrays, no row
// objects) so that it stays small next to the feed itself.
import type { CalendarException, CalendarRule } from '../../../shared/gtfs/service-dates'
import type { Findings } from './findings'
import { TableWriter } from './writer'
import { COPY_COLUMNS } from './columns'
import { GTFS_TABLES, type GtfsTable } from '../../db/tables/gtfs'

export interface ShapeGeometry {
  index: number
  id: string
  lat: Float64Array
  lon: Float64Array
  /** Metres along the shape at each point. */
  distM: Float64Array
  /** Metres per unit of the feed's shape_dist_traveled, when the shape gives it; else null. */
  metresPerUnit: number | null
}

export class FeedState {
  readonly writers: Record<GtfsTable, TableWriter>
  /** agency_id of the single agency when there is one; '' when it leaves agency_id blank. */
  agencyIds = new Set<string>()
  agencyTimezones = new Set<string>()

  stopIndex = new Map<string, number>()
  stopIds: string[] = []
  /** UTF-8 of each stop_id, encoded once for its many stop_times. */
  stopBytes: Buffer[] = []
  stopLat: number[] = []
  stopLon: number[] = []
  stopType: number[] = []
  stopUsed: Uint8Array = new Uint8Array(0)
  parentOf: { stop: number; parent: string; line: number }[] = []

  routeIndex = new Map<string, number>()
  routeUsed: boolean[] = []

  calendarServices = new Set<string>()
  calendarRules: CalendarRule[] = []
  calendarExceptions: CalendarException[] = []
  /** service_id of every trip, to find services that never run and the feed's date range. */
  usedServices = new Set<string>()

  shapes = new Map<string, ShapeGeometry>()
  shapeUsed = new Set<string>()

  tripIndex = new Map<string, number>()
  tripIds: string[] = []
  /** UTF-8 of each trip_id, encoded once for its many stop_times. */
  tripBytes: Buffer[] = []
  tripShape: (ShapeGeometry | null)[] = []
  tripRoute: number[] = []
  tripDirection: number[] = []
  tripStopTimes: Int32Array = new Int32Array(0)
  tripFirstDeparture: Int32Array = new Int32Array(0)
  /** Byte range [start, end) of each trip's stop_times in the scratch file, at 2t and 2t + 1. */
  tripSegment: Float64Array = new Float64Array(0)

  interpolatedStopTimes = 0
  serviceDateRows = 0
  frequencyTripRows = 0
  serviceStart: number | null = null
  serviceEnd: number | null = null

  constructor(readonly feedId: number, readonly workDir: string, readonly findings: Findings) {
    this.writers = Object.fromEntries(GTFS_TABLES.map((t) => [t, new TableWriter(workDir, t, COPY_COLUMNS[t])])) as Record<GtfsTable, TableWriter>
  }

  /** Once an error is found nothing will be loaded: stop writing rows, keep checking. */
  noteErrors() {
    if (this.findings.errorCount > 0) for (const w of Object.values(this.writers)) w.discard = true
  }

  closeWriters() {
    for (const w of Object.values(this.writers)) w.close()
  }

  disposeWriters() {
    for (const w of Object.values(this.writers)) w.dispose()
  }
}

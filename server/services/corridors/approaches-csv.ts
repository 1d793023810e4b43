// CSV import of a corridor's approaches in Fanlight's own columns (README). One line per approach
// and period: the approach columns repeat on each line of the same intersection and must agree;
// period, volume_veh_h and cross_volume_veh_h give that period's volumes. An approach named in the
// file is created, or updated when the corridor already has one at that intersection, and its
// volumes become those of the file. Everything is checked first; the writes run in one transaction.
import { randomUUID } from 'node:crypto'
import type { User } from 'lucia'
import { eq, sql } from 'drizzle-orm'
import type { DbOrTx } from '../signals/rows'
import { approachVolumes, corridorApproaches, intersections, organisations } from '../../db/schema'
import { num, oneOf, optional, text, type CsvColumn } from '../csv/columns'
import { csvText, readCsv, type CsvRecord } from '../csv/read-csv'
import { CsvInvalid, sortLineErrors } from '../csv/errors'
import { assertMayEditCorridor, corridorRow, periodsOf } from './rows'
import { approachIssues, type ApproachValues } from './approaches'
import { shapePoints } from './gtfs-queries'
import { shapeLine, snapToShape } from '../../../shared/corridors/shape-line'
import {
  DEFAULT_CHECK_IN_DISTANCE_M, DEFAULT_JAM_DENSITY_VEH_PER_KM_PER_LANE, DEFAULT_SATURATION_FLOW_VEH_PER_HOUR_PER_LANE,
  SNAP_MAX_OFFSET_M, STOP_RELATIONS, type StopRelation,
} from '../../../shared/corridors/approach-rules'
import type { ApproachesImportResult } from '../../../shared/schemas/corridors'
import type { CsvLineError } from '../../../shared/schemas/signals'

export const APPROACHES_CSV_COLUMNS: readonly CsvColumn[] = [
  text({ name: 'intersection_name', description: 'the intersection as named in Signals', example: 'Kestrel Ave & Example St' }),
  optional(text({ name: 'jurisdiction', description: 'its city (id or name), needed only when two cities use the same name', example: 'org-brackenford' })),
  optional(num({ name: 'distance_m', min: 0, max: 500_000, description: 'stop line along the corridor, m; empty: the intersection snapped to the shape', example: '' })),
  num({ name: 'lanes', min: 1, max: 8, integer: true, description: 'lanes of the corridor approach', example: '2' }),
  optional(num({ name: 'saturation_flow_veh_h_lane', min: 300, max: 2400, description: `per lane, veh/h (default ${DEFAULT_SATURATION_FLOW_VEH_PER_HOUR_PER_LANE})`, example: '1800' })),
  num({ name: 'speed_limit_kmh', min: 10, max: 130, description: 'speed limit of the approach, km/h', example: '50' }),
  optional(num({ name: 'jam_density_veh_km_lane', min: 60, max: 250, description: `per lane, veh/km (default ${DEFAULT_JAM_DENSITY_VEH_PER_KM_PER_LANE})`, example: '133' })),
  num({ name: 'cross_lanes', min: 1, max: 8, integer: true, description: 'lanes of the busier cross-street approach', example: '1' }),
  optional(num({ name: 'cross_saturation_flow_veh_h_lane', min: 300, max: 2400, description: `cross street, per lane, veh/h (default ${DEFAULT_SATURATION_FLOW_VEH_PER_HOUR_PER_LANE})`, example: '1800' })),
  optional(oneOf({ name: 'stop_relation', description: 'near-side, far-side or none (default none)', example: 'near-side' }, STOP_RELATIONS)),
  optional(text({ name: 'stop_id', max: 255, description: 'GTFS stop_id of the corridor stop at the signal', example: 'KA-012' })),
  optional(num({ name: 'dwell_s', min: 0, max: 600, description: 'mean dwell at that stop, s', example: '20' })),
  optional(num({ name: 'check_in_distance_m', min: 0, max: 2000, description: `where the bus asks for priority, m before the stop line (default ${DEFAULT_CHECK_IN_DISTANCE_M})`, example: '150' })),
  optional(text({ name: 'period', max: 40, description: 'a period of the corridor, by name', example: 'AM peak' })),
  optional(num({ name: 'volume_veh_h', min: 0, max: 20000, description: 'corridor approach volume in that period, all lanes, veh/h', example: '950' })),
  optional(num({ name: 'cross_volume_veh_h', min: 0, max: 20000, description: 'cross-street volume in that period, veh/h', example: '420' })),
]

const APPROACH_COLUMNS = ['distance_m', 'lanes', 'saturation_flow_veh_h_lane', 'speed_limit_kmh', 'jam_density_veh_km_lane', 'cross_lanes',
  'cross_saturation_flow_veh_h_lane', 'stop_relation', 'stop_id', 'dwell_s', 'check_in_distance_m'] as const

const COLUMN_OF_FIELD: Record<string, string> = {
  distanceM: 'distance_m', stopId: 'stop_id', stopRelation: 'stop_relation', dwellS: 'dwell_s', intersectionId: 'intersection_name', volumes: 'period',
}

export function approachesCsvTemplate(): string {
  const header = APPROACHES_CSV_COLUMNS.map((c) => c.name)
  const am = APPROACHES_CSV_COLUMNS.map((c) => c.example)
  const midday = APPROACHES_CSV_COLUMNS.map((c) => ({ period: 'Midday', volume_veh_h: '720', cross_volume_veh_h: '310' } as Record<string, string>)[c.name] ?? c.example)
  return csvText(header, [am, midday])
}

interface ApproachGroup {
  intersectionId: string
  name: string
  firstLine: number
  raw: Record<string, string>
  values: ApproachValues
  volumes: { periodId: string; volumeVehPerHour: number; crossVolumeVehPerHour: number; line: number }[]
}

export async function importApproachesCsv(db: DbOrTx, actor: User, corridorId: string, csv: string): Promise<ApproachesImportResult> {
  const corridor = await corridorRow(db, corridorId)
  assertMayEditCorridor(actor, corridor)
  const { records, errors } = readCsv(csv, APPROACHES_CSV_COLUMNS)
  const signals = await db.select({ id: intersections.id, name: intersections.name, lat: intersections.lat, lon: intersections.lon, jurisdictionId: intersections.jurisdictionId, cityName: organisations.name })
    .from(intersections).innerJoin(organisations, eq(intersections.jurisdictionId, organisations.id))
  const periods = await periodsOf(db, corridorId)
  const line = shapeLine(await shapePoints(db, corridor.feedVersionId, corridor.shapeId))
  const groups = new Map<string, ApproachGroup>()
  const bad = (r: CsvRecord) => errors.some((e) => e.line === r.line)
  const err = (r: CsvRecord, column: string, message: string) => errors.push({ line: r.line, column, value: r.raw[column] ?? '', message })

  for (const r of records) {
    if (bad(r)) continue
    const v = r.values as Record<string, never>
    const name = (v.intersection_name as string).toLowerCase()
    const city = (v.jurisdiction as string | undefined)?.toLowerCase()
    const matches = signals.filter((s) => s.name.toLowerCase() === name && (!city || s.jurisdictionId.toLowerCase() === city || s.cityName.toLowerCase() === city))
    if (matches.length !== 1) {
      err(r, 'intersection_name', matches.length ? 'Two cities have an intersection of this name: give the jurisdiction.' : 'No intersection of this name (add it under Signals first).')
      continue
    }
    const signal = matches[0]
    let group = groups.get(signal.id)
    if (!group) {
      let distanceM = v.distance_m as number | undefined
      let snapOffsetM: number | null = null
      if (distanceM === undefined) {
        const snap = snapToShape(line, signal.lat, signal.lon)
        if (snap.offsetM > SNAP_MAX_OFFSET_M) {
          err(r, 'distance_m', `The intersection is ${Math.round(snap.offsetM)} m from the corridor's shape (at most ${SNAP_MAX_OFFSET_M} m); give distance_m or check the intersection.`)
          continue
        }
        ;({ distanceM, offsetM: snapOffsetM } = snap)
      }
      group = {
        intersectionId: signal.id, name: signal.name, firstLine: r.line, raw: r.raw, volumes: [],
        values: {
          intersectionId: signal.id, distanceM, snapOffsetM, lanes: v.lanes,
          saturationFlowVehPerHourPerLane: (v.saturation_flow_veh_h_lane as number | undefined) ?? DEFAULT_SATURATION_FLOW_VEH_PER_HOUR_PER_LANE,
          speedLimitKmh: v.speed_limit_kmh,
          jamDensityVehPerKmPerLane: (v.jam_density_veh_km_lane as number | undefined) ?? DEFAULT_JAM_DENSITY_VEH_PER_KM_PER_LANE,
          crossLanes: v.cross_lanes,
          crossSaturationFlowVehPerHourPerLane: (v.cross_saturation_flow_veh_h_lane as number | undefined) ?? DEFAULT_SATURATION_FLOW_VEH_PER_HOUR_PER_LANE,
          stopRelation: ((v.stop_relation as StopRelation | undefined) ?? 'none'), stopId: (v.stop_id as string | undefined) ?? null,
          dwellS: (v.dwell_s as number | undefined) ?? null, checkInDistanceM: (v.check_in_distance_m as number | undefined) ?? DEFAULT_CHECK_IN_DISTANCE_M,
        },
      }
      groups.set(signal.id, group)
    } else {
      for (const col of APPROACH_COLUMNS) {
        if ((r.raw[col] ?? '') !== (group.raw[col] ?? '')) err(r, col, `Differs from line ${group.firstLine} of the same approach; give the same value on every line of "${group.name}".`)
      }
    }
    const periodName = v.period as string | undefined
    if (periodName === undefined) {
      if (v.volume_veh_h !== undefined || v.cross_volume_veh_h !== undefined) err(r, 'period', 'Volumes belong to a period: name it.')
      continue
    }
    const period = periods.find((p) => p.name.toLowerCase() === periodName.toLowerCase())
    if (!period) { err(r, 'period', `Not a period of this corridor (${periods.map((p) => p.name).join(', ')}).`); continue }
    if (group.volumes.some((x) => x.periodId === period.id)) { err(r, 'period', `Period "${period.name}" is given twice for "${group.name}".`); continue }
    if (v.volume_veh_h === undefined) err(r, 'volume_veh_h', 'A value is required with a period.')
    if (v.cross_volume_veh_h === undefined) err(r, 'cross_volume_veh_h', 'A value is required with a period.')
    if (v.volume_veh_h !== undefined && v.cross_volume_veh_h !== undefined) {
      group.volumes.push({ periodId: period.id, volumeVehPerHour: v.volume_veh_h, crossVolumeVehPerHour: v.cross_volume_veh_h, line: r.line })
    }
  }

  const existing = await db.select({ id: corridorApproaches.id, intersectionId: corridorApproaches.intersectionId }).from(corridorApproaches)
    .where(eq(corridorApproaches.corridorId, corridorId))
  for (const g of groups.values()) {
    const current = existing.find((e) => e.intersectionId === g.intersectionId)
    for (const issue of await approachIssues(db, corridor, g.values, undefined, current?.id)) {
      const column = COLUMN_OF_FIELD[String(issue.path[0])] ?? ''
      errors.push({ line: g.firstLine, column, value: g.raw[column] ?? '', message: issue.message } satisfies CsvLineError)
    }
  }
  if (errors.length) throw new CsvInvalid(sortLineErrors(errors))

  const result: ApproachesImportResult = { created: 0, updated: 0 }
  await db.transaction(async (tx) => {
    for (const g of groups.values()) {
      const current = existing.find((e) => e.intersectionId === g.intersectionId)
      let id: string
      if (current) {
        id = current.id
        await tx.update(corridorApproaches).set({ ...g.values, version: sql`${corridorApproaches.version} + 1`, updatedAt: sql`now()`, updatedBy: actor.id })
          .where(eq(corridorApproaches.id, id))
        await tx.delete(approachVolumes).where(eq(approachVolumes.approachId, id))
        result.updated++
      } else {
        id = randomUUID()
        await tx.insert(corridorApproaches).values({ id, corridorId, ...g.values, updatedBy: actor.id })
        result.created++
      }
      if (g.volumes.length) await tx.insert(approachVolumes).values(g.volumes.map(({ line: _line, ...v }) => ({ approachId: id, ...v })))
    }
  })
  return result
}

import { asc, eq, inArray } from 'drizzle-orm'
import type { User } from 'lucia'
import type { DbOrTx } from '../signals/rows'
import { approachVolumes, corridorApproaches, corridorPeriods, corridors, corridorStops, intersections, organisations } from '../../db/schema'
import { Forbidden, NotFound } from '../../errors'
import { mayEditCorridor } from '../../../shared/corridors/permissions'
import type { ApproachDto, PeriodDto } from '../../../shared/schemas/corridors'

export type CorridorRow = typeof corridors.$inferSelect
export type CorridorStopRow = typeof corridorStops.$inferSelect
export type ApproachRow = typeof corridorApproaches.$inferSelect

export async function corridorRow(db: DbOrTx, id: string): Promise<CorridorRow> {
  const [row] = await db.select().from(corridors).where(eq(corridors.id, id))
  if (!row) throw new NotFound('Corridor')
  return row
}

export function assertMayEditCorridor(actor: User, corridor: { agencyId: string }): void {
  if (!mayEditCorridor(actor, corridor.agencyId)) throw new Forbidden('Only the planners of the agency that owns this corridor may change it.')
}

export function stopsOf(db: DbOrTx, corridorId: string) {
  return db.select().from(corridorStops).where(eq(corridorStops.corridorId, corridorId)).orderBy(asc(corridorStops.seq))
}

export async function periodsOf(db: DbOrTx, corridorId: string): Promise<PeriodDto[]> {
  const rows = await db.select().from(corridorPeriods).where(eq(corridorPeriods.corridorId, corridorId)).orderBy(asc(corridorPeriods.sortOrder))
  return rows.map((p) => ({ id: p.id, name: p.name, startTime: p.startTime, endTime: p.endTime }))
}

/** Approaches of one corridor (or the given ids), in order along it, with their intersection and volumes. */
export async function approachDtos(db: DbOrTx, corridorId: string, onlyIds?: string[]): Promise<ApproachDto[]> {
  const rows = await db.select({ a: corridorApproaches, i: { name: intersections.name, lat: intersections.lat, lon: intersections.lon, jurisdictionId: intersections.jurisdictionId }, jurisdictionName: organisations.name })
    .from(corridorApproaches)
    .innerJoin(intersections, eq(corridorApproaches.intersectionId, intersections.id))
    .innerJoin(organisations, eq(intersections.jurisdictionId, organisations.id))
    .where(onlyIds ? inArray(corridorApproaches.id, onlyIds) : eq(corridorApproaches.corridorId, corridorId))
    .orderBy(asc(corridorApproaches.distanceM))
  if (!rows.length) return []
  const volumes = await db.select().from(approachVolumes).where(inArray(approachVolumes.approachId, rows.map((r) => r.a.id)))
  const stops = await stopsOf(db, corridorId)
  const stopName = new Map(stops.map((s) => [s.stopId, s.name]))
  return rows.map(({ a, i, jurisdictionName }) => ({
    id: a.id, corridorId: a.corridorId, intersectionId: a.intersectionId, intersectionName: i.name, jurisdictionId: i.jurisdictionId,
    jurisdictionName, lat: i.lat, lon: i.lon, distanceM: a.distanceM, snapOffsetM: a.snapOffsetM, lanes: a.lanes,
    saturationFlowVehPerHourPerLane: a.saturationFlowVehPerHourPerLane, speedLimitKmh: a.speedLimitKmh,
    jamDensityVehPerKmPerLane: a.jamDensityVehPerKmPerLane, crossLanes: a.crossLanes,
    crossSaturationFlowVehPerHourPerLane: a.crossSaturationFlowVehPerHourPerLane, stopRelation: a.stopRelation, stopId: a.stopId,
    stopName: a.stopId ? stopName.get(a.stopId) ?? null : null, dwellS: a.dwellS, checkInDistanceM: a.checkInDistanceM,
    volumes: volumes.filter((v) => v.approachId === a.id).map((v) => ({ periodId: v.periodId, volumeVehPerHour: v.volumeVehPerHour, crossVolumeVehPerHour: v.crossVolumeVehPerHour })),
    version: a.version, updatedAt: a.updatedAt.toISOString(),
  }))
}

// A corridor's approaches at the intersections it crosses: placed by distance along the shape or
// by snapping a point (the intersection itself by default), with the approach and cross-street
// data the model needs and the stop next to the signal. Planners of the agency edit them.
import { randomUUID } from 'node:crypto'
import type { User } from 'lucia'
import { and, eq, sql } from 'drizzle-orm'
import type { DbOrTx } from '../signals/rows'
import { approachVolumes, corridorApproaches, intersections } from '../../db/schema'
import { Conflict, NotFound, Unprocessable } from '../../errors'
import { approachDtos, assertMayEditCorridor, corridorRow, periodsOf, stopsOf, type ApproachRow, type CorridorRow } from './rows'
import { shapePoints } from './gtfs-queries'
import { shapeLine, snapToShape } from '../../../shared/corridors/shape-line'
import { SNAP_MAX_OFFSET_M, stopRelationProblem } from '../../../shared/corridors/approach-rules'
import { approachCreateBody, type ApproachCreateBody, type ApproachDto, type ApproachPatchBody } from '../../../shared/schemas/corridors'

type Issue = { path: (string | number)[]; message: string }

export async function listApproaches(db: DbOrTx, corridorId: string): Promise<ApproachDto[]> {
  await corridorRow(db, corridorId)
  return approachDtos(db, corridorId)
}

export async function getApproach(db: DbOrTx, corridorId: string, approachId: string): Promise<ApproachDto> {
  const [dto] = await approachDtos(db, corridorId, [(await approachRow(db, corridorId, approachId)).id])
  return dto
}

async function approachRow(db: DbOrTx, corridorId: string, approachId: string): Promise<ApproachRow> {
  const [row] = await db.select().from(corridorApproaches).where(and(eq(corridorApproaches.id, approachId), eq(corridorApproaches.corridorId, corridorId)))
  if (!row) throw new NotFound('Approach')
  return row
}

/** Position along the corridor from a snap of the point to its shape; refused when the point is far from it. */
export async function snapDistance(db: DbOrTx, corridor: CorridorRow, lat: number, lon: number, path: (string | number)[]): Promise<{ distanceM: number; snapOffsetM: number }> {
  const snap = snapToShape(shapeLine(await shapePoints(db, corridor.feedVersionId, corridor.shapeId)), lat, lon)
  if (snap.offsetM > SNAP_MAX_OFFSET_M) {
    throw new Unprocessable('The point is not on the corridor.', [{ path, message: `The point is ${Math.round(snap.offsetM)} m from the corridor's shape (at most ${SNAP_MAX_OFFSET_M} m).` }])
  }
  return { distanceM: snap.distanceM, snapOffsetM: snap.offsetM }
}

export interface ApproachValues {
  intersectionId: string; distanceM: number; snapOffsetM: number | null; lanes: number; saturationFlowVehPerHourPerLane: number
  speedLimitKmh: number; jamDensityVehPerKmPerLane: number; crossLanes: number; crossSaturationFlowVehPerHourPerLane: number
  stopRelation: ApproachRow['stopRelation']; stopId: string | null; dwellS: number | null; checkInDistanceM: number
}

/** The rules that involve the corridor: within its length, its stops, its periods, one approach per intersection. */
export async function approachIssues(db: DbOrTx, corridor: CorridorRow, v: ApproachValues, volumes: { periodId: string }[] | undefined, exceptId?: string): Promise<Issue[]> {
  const issues: Issue[] = []
  if (v.distanceM > corridor.lengthM + 1e-6) issues.push({ path: ['distanceM'], message: `The corridor is ${Math.round(corridor.lengthM)} m long.` })
  const [clash] = await db.select({ id: corridorApproaches.id }).from(corridorApproaches)
    .where(and(eq(corridorApproaches.corridorId, corridor.id), eq(corridorApproaches.intersectionId, v.intersectionId)))
  if (clash && clash.id !== exceptId) issues.push({ path: ['intersectionId'], message: 'The corridor already has an approach at this intersection.' })
  if (v.stopRelation === 'none') {
    if (v.stopId) issues.push({ path: ['stopId'], message: 'Give no stop when the relation is "none".' })
  } else {
    const stop = v.stopId ? (await stopsOf(db, corridor.id)).find((s) => s.stopId === v.stopId) : undefined
    if (!v.stopId) issues.push({ path: ['stopId'], message: `A ${v.stopRelation} approach names its stop.` })
    else if (!stop) issues.push({ path: ['stopId'], message: `Stop "${v.stopId}" is not on this corridor.` })
    else {
      const problem = stopRelationProblem(v.stopRelation, stop.distanceM, v.distanceM)
      if (problem) issues.push({ path: ['stopRelation'], message: problem })
    }
    if (v.dwellS === null) issues.push({ path: ['dwellS'], message: 'Give the mean dwell time at the stop.' })
  }
  if (volumes) {
    const periods = await periodsOf(db, corridor.id)
    volumes.forEach((x, i) => {
      if (!periods.some((p) => p.id === x.periodId)) issues.push({ path: ['volumes', i, 'periodId'], message: 'Not a period of this corridor.' })
    })
  }
  return issues
}

async function intersectionOf(db: DbOrTx, id: string) {
  const [row] = await db.select().from(intersections).where(eq(intersections.id, id))
  if (!row) throw new Unprocessable('No such intersection.', [{ path: ['intersectionId'], message: 'No such intersection.' }])
  return row
}

export async function createApproach(db: DbOrTx, actor: User, corridorId: string, input: ApproachCreateBody): Promise<ApproachDto> {
  const body = approachCreateBody.parse(input)
  const corridor = await corridorRow(db, corridorId)
  assertMayEditCorridor(actor, corridor)
  const signal = await intersectionOf(db, body.intersectionId)
  const { snap, volumes, ...fields } = body
  const position = body.distanceM !== undefined
    ? { distanceM: body.distanceM, snapOffsetM: null }
    : await snapDistance(db, corridor, snap?.lat ?? signal.lat, snap?.lon ?? signal.lon, snap ? ['snap'] : ['intersectionId'])
  const values: ApproachValues = { ...fields, ...position }
  const issues = await approachIssues(db, corridor, values, volumes)
  if (issues.length) throw new Unprocessable('The approach is not valid.', issues)
  const id = randomUUID()
  await db.transaction(async (tx) => {
    await tx.insert(corridorApproaches).values({ id, corridorId, ...values, updatedBy: actor.id })
    if (volumes.length) await tx.insert(approachVolumes).values(volumes.map((v) => ({ approachId: id, ...v })))
  })
  return getApproach(db, corridorId, id)
}

async function staleApproach(db: DbOrTx, corridorId: string, id: string) {
  return new Conflict('Someone else changed this approach since you opened it. Here is the current version.', { current: await getApproach(db, corridorId, id) })
}

export async function patchApproach(db: DbOrTx, actor: User, corridorId: string, approachId: string, body: ApproachPatchBody): Promise<ApproachDto> {
  const corridor = await corridorRow(db, corridorId)
  assertMayEditCorridor(actor, corridor)
  const row = await approachRow(db, corridorId, approachId)
  if (body.version !== row.version) throw await staleApproach(db, corridorId, approachId)
  const { version, snap, snapIntersection, volumes, ...changes } = body
  const signal = await intersectionOf(db, changes.intersectionId ?? row.intersectionId)
  let position: { distanceM: number; snapOffsetM: number | null } | undefined
  if (changes.distanceM !== undefined) position = { distanceM: changes.distanceM, snapOffsetM: null }
  else if (snap) position = await snapDistance(db, corridor, snap.lat, snap.lon, ['snap'])
  else if (snapIntersection) position = await snapDistance(db, corridor, signal.lat, signal.lon, ['snapIntersection'])
  const next: ApproachValues = { ...row, ...changes, ...(position ?? {}) }
  // Leaving the stop relation for "none" drops the stop with it.
  if (changes.stopRelation === 'none' && changes.stopId === undefined) { next.stopId = null; next.dwellS = null }
  const issues = await approachIssues(db, corridor, next, volumes, approachId)
  if (issues.length) throw new Unprocessable('The approach is not valid.', issues)
  await db.transaction(async (tx) => {
    const { intersectionId, distanceM, snapOffsetM, lanes, saturationFlowVehPerHourPerLane, speedLimitKmh, jamDensityVehPerKmPerLane, crossLanes,
      crossSaturationFlowVehPerHourPerLane, stopRelation, stopId, dwellS, checkInDistanceM } = next
    const [updated] = await tx.update(corridorApproaches).set({
      intersectionId, distanceM, snapOffsetM, lanes, saturationFlowVehPerHourPerLane, speedLimitKmh, jamDensityVehPerKmPerLane, crossLanes,
      crossSaturationFlowVehPerHourPerLane, stopRelation, stopId, dwellS, checkInDistanceM,
      version: sql`${corridorApproaches.version} + 1`, updatedAt: sql`now()`, updatedBy: actor.id,
    }).where(and(eq(corridorApproaches.id, approachId), eq(corridorApproaches.version, version))).returning({ id: corridorApproaches.id })
    if (!updated) throw await staleApproach(tx, corridorId, approachId)
    if (volumes) {
      await tx.delete(approachVolumes).where(eq(approachVolumes.approachId, approachId))
      if (volumes.length) await tx.insert(approachVolumes).values(volumes.map((v) => ({ approachId, ...v })))
    }
  })
  return getApproach(db, corridorId, approachId)
}

export async function deleteApproach(db: DbOrTx, actor: User, corridorId: string, approachId: string, version?: number): Promise<void> {
  const corridor = await corridorRow(db, corridorId)
  assertMayEditCorridor(actor, corridor)
  const row = await approachRow(db, corridorId, approachId)
  if (version !== undefined && version !== row.version) throw await staleApproach(db, corridorId, approachId)
  await db.delete(corridorApproaches).where(eq(corridorApproaches.id, approachId))
}

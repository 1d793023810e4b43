// CSV import of intersections with their timing plans, in Fanlight's own columns (README).
// One line per timing plan; the lines of one intersection (same jurisdiction and name) repeat its
// location and crossing distance, which must agree. The plans in the file become the complete set
// of plans of each intersection it names (a plan keeps its id when its name is unchanged). All
// lines are checked before anything is written, and the writes run in one transaction.
import { randomUUID } from 'node:crypto'
import type { User } from 'lucia'
import { and, eq, inArray, notInArray, sql } from 'drizzle-orm'
import { intersections, organisations, timingPlans } from '../../db/schema'
import { bool, dayTypes, num, optional, text, timeOfDay, type CsvColumn } from '../csv/columns'
import { csvText, readCsv, type CsvRecord } from '../csv/read-csv'
import { CsvInvalid, sortLineErrors } from '../csv/errors'
import { checkPlanSchedule, checkTiming, errorsOf, type TimingField } from '../../../shared/signals/checks'
import type { TimingPlanValues } from '../../../shared/signals/timing-plan'
import type { CsvLineError, SignalsImportResult } from '../../../shared/schemas/signals'
import { PED_WALK_DEFAULT_MIN_S, PED_WALK_LOWEST_MIN_S } from '../../../shared/signals/limits'
import { mayEditSignal } from '../../../shared/signals/permissions'
import type { DbOrTx } from './rows'

export const SIGNALS_CSV_COLUMNS: readonly CsvColumn[] = [
  text({ name: 'intersection_name', description: 'the two streets, unique within the city', example: 'Kestrel Ave & Example St' }),
  num({ name: 'lat', min: -90, max: 90, description: 'latitude, WGS 84 degrees', example: '51.0421' }),
  num({ name: 'lon', min: -180, max: 180, description: 'longitude, WGS 84 degrees', example: '-1.8532' }),
  text({ name: 'jurisdiction', description: 'the city that owns the signal: its id or its name', example: 'org-brackenford' }),
  num({ name: 'crossing_distance_m', min: 0, exclusiveMin: true, max: 150, description: 'length of the crosswalk across the bus street, m', example: '16' }),
  optional(num({ name: 'min_ped_walk_s', min: PED_WALK_LOWEST_MIN_S, max: PED_WALK_DEFAULT_MIN_S, description: 'shortest walk interval allowed here, s (default 7; as low as 4 where allowed)', example: '7' })),
  text({ name: 'plan_name', max: 60, description: 'name of the timing plan, unique per intersection', example: 'AM peak' }),
  dayTypes({ name: 'day_types', description: 'weekday, saturday, sunday, separated by ";"', example: 'weekday' }),
  timeOfDay({ name: 'start_time', description: 'start of the plan, HH:MM', example: '07:00' }),
  timeOfDay({ name: 'end_time', description: 'end of the plan, HH:MM (earlier than the start: runs past midnight; 24:00 allowed)', example: '09:00' }),
  num({ name: 'cycle_s', min: 0, exclusiveMin: true, max: 300, description: 'cycle length, s', example: '100' }),
  num({ name: 'bus_green_s', min: 0, exclusiveMin: true, max: 300, description: 'green of the bus-street phase, s', example: '52' }),
  num({ name: 'yellow_s', min: 0, max: 20, description: 'yellow change interval of each phase, s', example: '4' }),
  num({ name: 'red_clearance_s', min: 0, max: 20, description: 'red clearance interval of each phase, s', example: '2' }),
  num({ name: 'cross_min_green_s', min: 0, max: 300, description: 'minimum green of the cross-street phase, s', example: '10' }),
  num({ name: 'ped_walk_s', min: 0, max: 120, description: 'walk interval of the crosswalk across the bus street, s', example: '7' }),
  num({ name: 'ped_clearance_s', min: 0, max: 120, description: 'pedestrian clearance (flashing don\'t walk), s', example: '15' }),
  num({ name: 'offset_s', min: 0, max: 300, description: 'start of bus-street green after the common reference, s', example: '0' }),
  optional(bool({ name: 'ped_concurrent', description: 'pedestrians cross the bus street with the cross-street green: yes or no (default yes)', example: 'yes' })),
]

/** Which column a timing check's field was read from. */
const COLUMN_OF: Record<TimingField, string> = {
  name: 'plan_name', dayTypes: 'day_types', startTime: 'start_time', endTime: 'end_time', cycleS: 'cycle_s', busGreenS: 'bus_green_s',
  yellowS: 'yellow_s', redClearanceS: 'red_clearance_s', crossMinGreenS: 'cross_min_green_s', pedWalkS: 'ped_walk_s',
  pedClearanceS: 'ped_clearance_s', offsetS: 'offset_s', pedConcurrent: 'ped_concurrent',
}

export function signalsCsvTemplate(): string {
  const header = SIGNALS_CSV_COLUMNS.map((c) => c.name)
  const example = SIGNALS_CSV_COLUMNS.map((c) => c.example)
  const midday = SIGNALS_CSV_COLUMNS.map((c) => ({ plan_name: 'Midday', start_time: '09:00', end_time: '15:00', cycle_s: '90', bus_green_s: '46' } as Record<string, string>)[c.name] ?? c.example)
  return csvText(header, [example, midday])
}

interface SignalGroup {
  key: string
  jurisdictionId: string
  name: string
  lat: number
  lon: number
  crossingDistanceM: number
  minPedWalkS: number
  firstLine: number
  plans: (TimingPlanValues & { line: number })[]
}

const SIGNAL_COLUMNS = ['lat', 'lon', 'crossing_distance_m', 'min_ped_walk_s'] as const

/** Validates the whole file; returns the intersections to write, or throws CsvInvalid. */
async function readSignalsFile(db: DbOrTx, actor: User, csv: string): Promise<SignalGroup[]> {
  const { records, errors } = readCsv(csv, SIGNALS_CSV_COLUMNS)
  const cities = (await db.select().from(organisations)).filter((o) => o.kind === 'city')
  const cityByKey = new Map(cities.flatMap((c) => [[c.id.toLowerCase(), c], [c.name.toLowerCase(), c]] as const))
  const groups = new Map<string, SignalGroup>()
  const lineErrors = (r: CsvRecord) => errors.some((e) => e.line === r.line)

  for (const r of records) {
    const v = r.values as Record<string, never>
    const cityRaw = r.raw.jurisdiction ?? ''
    const city = cityRaw ? cityByKey.get(cityRaw.toLowerCase()) : undefined
    if (cityRaw && !city) errors.push({ line: r.line, column: 'jurisdiction', value: cityRaw, message: `No city with this id or name (known: ${cities.map((c) => c.id).join(', ')}).` })
    else if (city && !mayEditSignal(actor, city.id)) {
      errors.push({ line: r.line, column: 'jurisdiction', value: cityRaw, message: `You may import only the signals of your own city; this line belongs to ${city.name}.` })
    }
    if (!city || lineErrors(r)) continue
    const name = v.intersection_name as string
    const key = `${city.id}\u0000${name.toLowerCase()}`
    const signal = {
      lat: v.lat as number, lon: v.lon as number, crossingDistanceM: v.crossing_distance_m as number,
      minPedWalkS: (v.min_ped_walk_s as number | undefined) ?? PED_WALK_DEFAULT_MIN_S,
    }
    let group = groups.get(key)
    if (!group) {
      group = { key, jurisdictionId: city.id, name, ...signal, firstLine: r.line, plans: [] }
      groups.set(key, group)
    } else {
      const g = group
      const same: Record<(typeof SIGNAL_COLUMNS)[number], boolean> = {
        lat: Math.abs(g.lat - signal.lat) < 1e-7, lon: Math.abs(g.lon - signal.lon) < 1e-7,
        crossing_distance_m: g.crossingDistanceM === signal.crossingDistanceM, min_ped_walk_s: g.minPedWalkS === signal.minPedWalkS,
      }
      for (const col of SIGNAL_COLUMNS) {
        if (!same[col]) errors.push({ line: r.line, column: col, value: r.raw[col] ?? '', message: `Differs from line ${g.firstLine} of the same intersection; give the same value on every line of "${g.name}".` })
      }
    }
    const plan: TimingPlanValues & { line: number } = {
      line: r.line, name: v.plan_name, dayTypes: v.day_types, startTime: v.start_time, endTime: v.end_time,
      cycleS: v.cycle_s, busGreenS: v.bus_green_s, yellowS: v.yellow_s, redClearanceS: v.red_clearance_s,
      crossMinGreenS: v.cross_min_green_s, pedWalkS: v.ped_walk_s, pedClearanceS: v.ped_clearance_s, offsetS: v.offset_s,
      pedConcurrent: (v.ped_concurrent as boolean | undefined) ?? true,
    }
    for (const e of errorsOf(checkTiming(plan, group))) errors.push(timingLineError(r, e.path[0] as TimingField, e.message))
    group.plans.push(plan)
  }
  for (const g of groups.values()) {
    for (const e of errorsOf(checkPlanSchedule(g.plans))) {
      const plan = g.plans[e.path[0] as number]
      const field = e.path[1] as TimingField
      errors.push({ line: plan.line, column: COLUMN_OF[field], value: field === 'name' ? plan.name : `${plan.startTime}-${plan.endTime}`, message: e.message })
    }
  }
  if (errors.length) throw new CsvInvalid(sortLineErrors(errors))
  return [...groups.values()]
}

function timingLineError(r: CsvRecord, field: TimingField, message: string): CsvLineError {
  const column = COLUMN_OF[field]
  return { line: r.line, column, value: r.raw[column] ?? '', message }
}

/** Imports the file as a whole or not at all. */
export async function importSignalsCsv(db: DbOrTx, actor: User, csv: string): Promise<SignalsImportResult> {
  const groups = await readSignalsFile(db, actor, csv)
  const result: SignalsImportResult = { intersectionsCreated: 0, intersectionsUpdated: 0, plansCreated: 0, plansUpdated: 0 }
  await db.transaction(async (tx) => {
    const jurisdictions = [...new Set(groups.map((g) => g.jurisdictionId))]
    const existing = await tx.select().from(intersections).where(inArray(intersections.jurisdictionId, jurisdictions))
    const existingByKey = new Map(existing.map((e) => [`${e.jurisdictionId}\u0000${e.name.toLowerCase()}`, e]))
    for (const g of groups) {
      const signal = { name: g.name, lat: g.lat, lon: g.lon, crossingDistanceM: g.crossingDistanceM, minPedWalkS: g.minPedWalkS, updatedBy: actor.id }
      const found = existingByKey.get(g.key)
      let id: string
      if (found) {
        id = found.id
        await tx.update(intersections).set({ ...signal, version: sql`${intersections.version} + 1`, updatedAt: sql`now()` }).where(eq(intersections.id, id))
        result.intersectionsUpdated++
      } else {
        id = randomUUID()
        await tx.insert(intersections).values({ id, jurisdictionId: g.jurisdictionId, ...signal })
        result.intersectionsCreated++
      }
      const kept = await tx.select({ id: timingPlans.id, name: timingPlans.name }).from(timingPlans).where(eq(timingPlans.intersectionId, id))
      const keptByName = new Map(kept.map((p) => [p.name.toLowerCase(), p.id]))
      const keepIds = g.plans.map((p) => keptByName.get(p.name.toLowerCase())).filter((x): x is string => !!x)
      await tx.delete(timingPlans).where(and(eq(timingPlans.intersectionId, id), keepIds.length ? notInArray(timingPlans.id, keepIds) : undefined))
      for (const { line: _line, ...plan } of g.plans) {
        const planId = keptByName.get(plan.name.toLowerCase())
        if (planId) {
          await tx.update(timingPlans).set({ ...plan, dayTypes: [...plan.dayTypes], version: sql`${timingPlans.version} + 1`, updatedAt: sql`now()`, updatedBy: actor.id }).where(eq(timingPlans.id, planId))
          result.plansUpdated++
        } else {
          await tx.insert(timingPlans).values({ id: randomUUID(), intersectionId: id, ...plan, dayTypes: [...plan.dayTypes], updatedBy: actor.id })
          result.plansCreated++
        }
      }
    }
  })
  return result
}

import { sql } from 'drizzle-orm'
import type { Db } from '../../db'
import { NotFound } from '../../errors'
import { dayTypeOfIso } from './service-day'
import type { CoverageDto } from '../../../shared/schemas/realtime'

/** Which service days hold observations of the corridor's trips, and of how many trips. */
export async function corridorCoverage(db: Db, corridorId: string): Promise<CoverageDto> {
  const [c] = (await db.execute<{ feed_version_id: number; route_ids: string[]; direction_id: number }>(sql`
    select feed_version_id, route_ids, direction_id from corridors where id = ${corridorId}`)).rows
  if (!c) throw new NotFound('Corridor')
  const rows = (await db.execute<{ date: string; trips: number }>(sql`
    with trips as (
      select trip_id from gtfs_trips
      where feed_version_id = ${c.feed_version_id} and route_id = any(${sql.param(c.route_ids)}) and direction_id = ${c.direction_id}
    ), seen as (
      select service_date, trip_id from realtime_vehicle_observations
      where feed_version_id = ${c.feed_version_id} and trip_id in (select trip_id from trips)
      union
      select service_date, trip_id from realtime_stop_time_observations
      where feed_version_id = ${c.feed_version_id} and trip_id in (select trip_id from trips)
    )
    select service_date::text as date, count(distinct trip_id)::int as trips from seen group by service_date order by service_date`)).rows
  return { corridorId, days: rows.map((r) => ({ date: r.date, trips: Number(r.trips), dayType: dayTypeOfIso(r.date) })) }
}

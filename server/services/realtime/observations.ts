import type { Db } from '../../db'
import { loadCorridor, loadObservationRows, type CorridorInfo } from './corridor-data'
import { deriveCorridorTrips, type CorridorDerivation } from './derive'
import { tripIndexFor } from './trip-index'
import type { ObservationsDto } from '../../../shared/schemas/realtime'

/** The corridor and its trips' observed times over service days from..to (ISO, both included; open when absent). */
export async function observeCorridor(db: Db, corridorId: string, from?: string, to?: string): Promise<{ corridor: CorridorInfo; derived: CorridorDerivation }> {
  const corridor = await loadCorridor(db, corridorId)
  const rows = await loadObservationRows(db, corridor, from, to)
  const ix = await tripIndexFor(db, corridor.feedVersionId)
  return { corridor, derived: deriveCorridorTrips(corridor, rows, (tripId, startTime) => ix.shiftFor(tripId, startTime)) }
}

export async function corridorObservations(db: Db, corridorId: string, from?: string, to?: string): Promise<ObservationsDto> {
  const { corridor, derived } = await observeCorridor(db, corridorId, from, to)
  return {
    corridorId,
    feedVersionId: corridor.feedVersionId,
    timeZone: corridor.timeZone,
    from: from ?? null,
    to: to ?? null,
    runFromM: derived.runFromM,
    runToM: derived.runToM,
    periods: corridor.periods,
    segments: derived.segments,
    trips: derived.trips,
  }
}

// A corridor ready for proposals on the corridor test feed: route 7 eastbound with four signals,
// two in each city, every period with volumes. The timing plan is worked by hand:
// 90 s cycle, 46 s bus green, 4 s yellow + 2 s red clearance per phase, so the cross street has
// 90 - 46 - 2 x 6 = 32 s of green; pedestrians walk with it for 7 + 14 = 21 s (above the 8 s
// minimum green), which leaves 32 - 21 = 11 s that priority may take per cycle.
import type { TestApp } from './test-app'
import { importCorridorFeed } from './corridor-feed'

export const ALL_DAY_PLAN = {
  name: 'All day', dayTypes: ['weekday', 'saturday', 'sunday'], startTime: '00:00', endTime: '24:00',
  cycleS: 90, busGreenS: 46, yellowS: 4, redClearanceS: 2, crossMinGreenS: 8, pedWalkS: 7, pedClearanceS: 14, offsetS: 0,
}
export const SPARE_CROSS_GREEN_S = 11

export interface ProposalCorridor {
  feedId: number
  corridorId: string
  periods: { id: string; name: string }[]
  /** In order along the corridor: Brackenford, Osterfield, Brackenford, Osterfield. */
  intersections: { id: string; name: string; jurisdictionId: string }[]
}

export async function buildProposalCorridor(t: TestApp): Promise<ProposalCorridor> {
  const feedId = await importCorridorFeed(t)
  const make = async (who: 'engineer' | 'engineer2', name: string, lon: number, jurisdictionId: string, plans: object[]) =>
    (await (await t.as(who)).post('/api/intersections').send({ name, lat: 51.0, lon, jurisdictionId, crossingDistanceM: 14, plans }).expect(201)).body
  const weekdayOnly = { ...ALL_DAY_PLAN, name: 'Weekdays', dayTypes: ['weekday'] }
  const xs = [
    await make('engineer', 'Main St & First Ave', -1.8955, 'org-brackenford', [ALL_DAY_PLAN]),
    await make('engineer2', 'Main St & Second Ave', -1.8875, 'org-osterfield', [ALL_DAY_PLAN]),
    await make('engineer', 'Main St & Third Ave', -1.885, 'org-brackenford', [ALL_DAY_PLAN]),
    // Weekdays only: the weekend periods of this row cannot be evaluated.
    await make('engineer2', 'Main St & Fourth Ave', -1.879, 'org-osterfield', [weekdayOnly]),
  ]
  const planner = await t.as('planner')
  const corridor = (await planner.post('/api/corridors').send({ feedId, name: 'Main St eastbound', routeIds: ['7'], directionId: 0 }).expect(201)).body
  const volumes = corridor.periods.map((p: { id: string }) => ({ periodId: p.id, volumeVehPerHour: 900, crossVolumeVehPerHour: 400 }))
  const stops = [
    { stopRelation: 'far-side', stopId: 'S2', dwellS: 20 },
    { stopRelation: 'near-side', stopId: 'S3', dwellS: 20 },
    { stopRelation: 'none' },
    { stopRelation: 'none' },
  ]
  for (const [i, x] of xs.entries()) {
    await planner.post(`/api/corridors/${corridor.id}/approaches`)
      .send({ intersectionId: x.id, lanes: 2, speedLimitKmh: 50, crossLanes: 1, volumes, ...stops[i] }).expect(201)
  }
  return { feedId, corridorId: corridor.id, periods: corridor.periods, intersections: xs }
}

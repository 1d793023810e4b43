import { api } from './client'
import type {
  ApproachCreateBody, ApproachDto, ApproachesImportResult, ApproachPatchBody, CorridorCreateBody, CorridorDetailDto, CorridorPatchBody,
  CorridorSummaryDto,
} from '@shared/schemas/corridors'
import type { FeedSummaryDto, RouteSummaryDto } from '@shared/schemas/gtfs'

const enc = encodeURIComponent

export const listCorridors = () => api<CorridorSummaryDto[]>('GET', '/corridors')
export const getCorridor = (id: string) => api<CorridorDetailDto>('GET', `/corridors/${enc(id)}`)
export const createCorridor = (body: CorridorCreateBody) => api<CorridorDetailDto>('POST', '/corridors', body)
export const patchCorridor = (id: string, body: CorridorPatchBody) => api<CorridorDetailDto>('PATCH', `/corridors/${enc(id)}`, body)
export const deleteCorridor = (id: string, version: number) => api<void>('DELETE', `/corridors/${enc(id)}?version=${version}`)

export const createApproach = (id: string, body: ApproachCreateBody) => api<ApproachDto>('POST', `/corridors/${enc(id)}/approaches`, body)
export const patchApproach = (id: string, aid: string, body: ApproachPatchBody) =>
  api<ApproachDto>('PATCH', `/corridors/${enc(id)}/approaches/${enc(aid)}`, body)
export const deleteApproach = (id: string, aid: string, version: number) =>
  api<void>('DELETE', `/corridors/${enc(id)}/approaches/${enc(aid)}?version=${version}`)

export const APPROACHES_TEMPLATE_URL = '/api/corridors/approaches/import/template'
export function importApproachesCsv(id: string, file: File) {
  const form = new FormData()
  form.append('file', file)
  return api<ApproachesImportResult>('POST', `/corridors/${enc(id)}/approaches/import`, form)
}

// The feed lists the New corridor dialog picks from (the feeds API of the GTFS import).
export const listFeedsForCorridor = () => api<FeedSummaryDto[]>('GET', '/feeds')
export const listFeedRoutes = (feedId: number) => api<RouteSummaryDto[]>('GET', `/feeds/${feedId}/routes`)

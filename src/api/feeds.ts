import { api } from './client'
import type { FeedDetailDto, FeedSummaryDto, FeedUploadedDto, RouteSummaryDto, ShapeDto } from '@shared/schemas/gtfs'
import type { JobDto } from '@shared/schemas/jobs'

export const listFeeds = () => api<FeedSummaryDto[]>('GET', '/feeds')
export const getFeed = (id: number) => api<FeedDetailDto>('GET', `/feeds/${id}`)
export const deleteFeed = (id: number) => api<void>('DELETE', `/feeds/${id}`)
export const feedRoutes = (id: number) => api<RouteSummaryDto[]>('GET', `/feeds/${id}/routes`)
export const feedShape = (id: number, shapeId: string) => api<ShapeDto>('GET', `/feeds/${id}/shapes/${encodeURIComponent(shapeId)}`)
export const getImportJob = (jobId: string) => api<JobDto>('GET', `/jobs/${encodeURIComponent(jobId)}`)

export function uploadFeed(file: File, name?: string) {
  const form = new FormData()
  if (name) form.append('name', name)
  form.append('file', file)
  return api<FeedUploadedDto>('POST', '/feeds', form)
}

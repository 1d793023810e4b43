import { api } from './client'
import type { JobDto } from '@shared/schemas/jobs'
import type {
  BeforeAfterDto, CalibrationDto, CoverageDto, LatenessDto, ObservationsDto, RealtimeSourceBody, RealtimeSourceDto, RealtimeUploadResultDto,
  RealtimeFileResultDto,
} from '@shared/schemas/realtime'

const enc = encodeURIComponent
const query = (params: Record<string, string | number | undefined>) =>
  Object.entries(params).filter(([, v]) => v !== undefined && v !== '').map(([k, v]) => `${k}=${enc(String(v))}`).join('&')

/** .pb files or zips of them, in the multipart field "files". */
export function uploadSnapshots(files: File[], feedVersionId?: number) {
  const form = new FormData()
  if (feedVersionId !== undefined) form.append('feedVersionId', String(feedVersionId))
  for (const f of files) form.append('files', f, f.name)
  return api<RealtimeUploadResultDto>('POST', '/realtime/snapshots', form)
}
export const getJob = (jobId: string) => api<JobDto>('GET', `/jobs/${enc(jobId)}`)

export const listSources = () => api<RealtimeSourceDto[]>('GET', '/realtime/sources')
export const createSource = (body: RealtimeSourceBody) => api<RealtimeSourceDto>('POST', '/realtime/sources', body)
export const deleteSource = (id: string) => api<void>('DELETE', `/realtime/sources/${enc(id)}`)
export const pollSource = (id: string) => api<RealtimeFileResultDto>('POST', `/realtime/sources/${enc(id)}/poll`)
export const getDemoFeed = () => api<{ url: string | null }>('GET', '/realtime/demo-feed')

export interface DateRange { from?: string; to?: string }
export const getObservations = (corridorId: string, r: DateRange = {}) =>
  api<ObservationsDto>('GET', `/realtime/observations?${query({ corridorId, ...r })}`)
export const getLateness = (corridorId: string, r: DateRange = {}, lateThresholdS?: number) =>
  api<LatenessDto>('GET', `/realtime/lateness?${query({ corridorId, ...r, lateThresholdS })}`)
export const getCalibration = (corridorId: string, r: DateRange = {}) =>
  api<CalibrationDto>('GET', `/realtime/calibration?${query({ corridorId, ...r })}`)

export interface BeforeAfterParams {
  beforeFrom: string
  beforeTo: string
  afterFrom: string
  afterTo: string
  dayType?: string
  periodId?: string
}
export const getBeforeAfter = (corridorId: string, p: BeforeAfterParams) =>
  api<BeforeAfterDto>('GET', `/realtime/before-after?${query({ corridorId, ...p })}`)
export const getCoverage = (corridorId: string) => api<CoverageDto>('GET', `/realtime/coverage?${query({ corridorId })}`)

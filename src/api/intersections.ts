import { api } from './client'
import type {
  IntersectionBody, IntersectionDto, IntersectionPatchBody, SignalsImportResult, TimingPlanBody, TimingPlanDto, TimingPlanPatchBody,
} from '@shared/schemas/signals'

const enc = encodeURIComponent

export const listIntersections = (jurisdictionId?: string) =>
  api<IntersectionDto[]>('GET', `/intersections${jurisdictionId ? `?jurisdictionId=${enc(jurisdictionId)}` : ''}`)
export const getIntersection = (id: string) => api<IntersectionDto>('GET', `/intersections/${enc(id)}`)
export const createIntersection = (body: IntersectionBody) => api<IntersectionDto>('POST', '/intersections', body)
export const patchIntersection = (id: string, body: IntersectionPatchBody) => api<IntersectionDto>('PATCH', `/intersections/${enc(id)}`, body)
export const deleteIntersection = (id: string, version: number) => api<void>('DELETE', `/intersections/${enc(id)}?version=${version}`)

export const createTimingPlan = (id: string, body: TimingPlanBody) => api<TimingPlanDto>('POST', `/intersections/${enc(id)}/plans`, body)
export const patchTimingPlan = (id: string, planId: string, body: TimingPlanPatchBody) =>
  api<TimingPlanDto>('PATCH', `/intersections/${enc(id)}/plans/${enc(planId)}`, body)
export const deleteTimingPlan = (id: string, planId: string, version: number) =>
  api<void>('DELETE', `/intersections/${enc(id)}/plans/${enc(planId)}?version=${version}`)

export const SIGNALS_TEMPLATE_URL = '/api/intersections/import/template'
export function importSignalsCsv(file: File) {
  const form = new FormData()
  form.append('file', file)
  return api<SignalsImportResult>('POST', '/intersections/import', form)
}

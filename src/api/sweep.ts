// Typed calls of the trade-off sweep, the suggested settings and the cities' limits.
import { api } from './client'
import type { SuggestBody, SuggestResponse, SweepBody, SweepResponse } from '@shared/schemas/sweep'
import type { CityLimitsDto, CityLimitsPutBody } from '@shared/schemas/city-limits'

const enc = encodeURIComponent

export const runSweep = (body: SweepBody) => api<SweepResponse>('POST', '/model/sweep', body)
export const suggestSettings = (proposalId: string, body: SuggestBody) => api<SuggestResponse>('POST', `/proposals/${enc(proposalId)}/suggest`, body)
export const getCityLimits = (orgId: string) => api<CityLimitsDto>('GET', `/cities/${enc(orgId)}/limits`)
export const putCityLimits = (orgId: string, body: CityLimitsPutBody) => api<CityLimitsDto>('PUT', `/cities/${enc(orgId)}/limits`, body)

// Typed calls of /api/proposals. A 409 carries the row as it now is (see rowFromConflict).
import { api, ApiError } from './client'
import type {
  AnswerBody, DecisionBody, ProposalCreateBody, ProposalDto, ProposalRowDto, ProposalSummaryDto, RowPatchBody, StoredResultDto,
} from '@shared/schemas/proposals'
import type { JobDto } from '@shared/schemas/jobs'
import type { TimeSpaceBody, TimeSpaceResult } from '@shared/schemas/model'

const p = (id: string) => `/proposals/${encodeURIComponent(id)}`
const r = (id: string, rowId: string) => `${p(id)}/rows/${encodeURIComponent(rowId)}`

export const listProposals = (corridorId?: string) =>
  api<ProposalSummaryDto[]>('GET', `/proposals${corridorId ? `?corridorId=${encodeURIComponent(corridorId)}` : ''}`)
export const getProposal = (id: string) => api<ProposalDto>('GET', p(id))
export const createProposal = (body: ProposalCreateBody) => api<ProposalDto>('POST', '/proposals', body)
export const patchRow = (id: string, rowId: string, body: RowPatchBody) => api<ProposalRowDto>('PATCH', r(id, rowId), body)
export const evaluateProposal = (id: string) => api<{ jobId: string }>('POST', `${p(id)}/evaluate`)
export const submitProposal = (id: string, comment = '') => api<ProposalDto>('POST', `${p(id)}/submit`, { comment })
export const decideRow = (id: string, rowId: string, body: DecisionBody) => api<ProposalRowDto>('POST', `${r(id, rowId)}/decision`, body)
export const answerRow = (id: string, rowId: string, body: AnswerBody) => api<ProposalRowDto>('POST', `${r(id, rowId)}/answer`, body)
export const getRowResults = (id: string, rowId: string) => api<StoredResultDto[]>('GET', `${r(id, rowId)}/results`)
export const getJob = (jobId: string) => api<JobDto>('GET', `/jobs/${encodeURIComponent(jobId)}`)

/** Corridors to start a proposal on (only the fields this page needs). */
export const listCorridorChoices = () => api<{ id: string; name: string }[]>('GET', '/corridors')

/** The current row sent back with a 409, when the error is a stale-version conflict. */
export function rowFromConflict(err: unknown): ProposalRowDto | null {
  if (!(err instanceof ApiError) || err.status !== 409) return null
  const row = (err.body as { row?: ProposalRowDto } | null)?.row
  return row ?? null
}

/** The Godunov field of a stored model input, for the time-space diagram of a row. */
export const timeSpaceOf = (body: TimeSpaceBody) => api<TimeSpaceResult>('POST', '/model/time-space', body)

// Typed calls of /api/dashboard (savings, inputs) and /api/proposals/:id/report.
import { api } from './client'
import type { DashboardDto, ProposalReportDto, SavingsInputsBody, SavingsInputsDto } from '@shared/schemas/savings'

const query = (q: Record<string, string | number | undefined>) => {
  const s = new URLSearchParams(Object.entries(q).filter(([, v]) => v !== undefined && v !== '').map(([k, v]) => [k, String(v)])).toString()
  return s ? `?${s}` : ''
}

export const getDashboard = (q: { corridorId?: string; feedId?: number; from?: string } = {}) => api<DashboardDto>('GET', `/dashboard${query(q)}`)
export const getSavingsInputs = (corridorId?: string) => api<SavingsInputsDto>('GET', `/dashboard/inputs${query({ corridorId })}`)
export const putSavingsInputs = (body: SavingsInputsBody) => api<SavingsInputsDto>('PUT', '/dashboard/inputs', body)
export const getProposalReport = (proposalId: string, from?: string) =>
  api<ProposalReportDto>('GET', `/proposals/${encodeURIComponent(proposalId)}/report${query({ from })}`)

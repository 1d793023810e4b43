import type { RowStatus } from '@shared/schemas/proposals'

/** What the corridor pages colour a signal by: its proposal row's status, or no proposal yet. */
export type StripStatus = RowStatus | 'no-proposal'

export const STATUS_LABELS: Record<StripStatus, string> = {
  'no-proposal': 'no proposal', draft: 'draft', submitted: 'awaiting the city', accepted: 'accepted', rejected: 'refused', 'change-requested': 'change asked',
}

export const STATUS_COLOURS: Record<StripStatus, string> = {
  'no-proposal': '#b9c0b5', draft: '#8aa2ad', submitted: '#f2b33d', accepted: '#2f7d4f', rejected: '#b23a3a', 'change-requested': '#b7791f',
}

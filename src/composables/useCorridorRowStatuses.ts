import { ref, watch, type Ref } from 'vue'
import { getProposal, listProposals } from '@/api/proposals'
import type { StripStatus } from '@/components/corridor-status'

/**
 * The status of each approach of a corridor in its most recent proposal (submitted ones first,
 * since those are what the cities are deciding), keyed by approach id.
 */
export function useCorridorRowStatuses(corridorId: Ref<string>) {
  const statuses = ref<Record<string, StripStatus>>({})
  const proposalName = ref<string | null>(null)

  watch(corridorId, async (id) => {
    statuses.value = {}
    proposalName.value = null
    const proposals = await listProposals(id)
    const latest = [...proposals].sort((a, b) =>
      Number(b.submittedAt !== null) - Number(a.submittedAt !== null) || (b.submittedAt ?? '').localeCompare(a.submittedAt ?? ''))[0]
    if (!latest) return
    const proposal = await getProposal(latest.id)
    if (corridorId.value !== id) return
    proposalName.value = proposal.name
    statuses.value = Object.fromEntries(proposal.rows.map((r) => [r.approachId, r.status]))
  }, { immediate: true })

  return { statuses, proposalName }
}

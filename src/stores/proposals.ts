import { defineStore } from 'pinia'
import { ref } from 'vue'
import * as proposalsApi from '@/api/proposals'
import { rowFromConflict } from '@/api/proposals'
import { describeRowChanges } from '@shared/proposals/row-diff'
import type {
  AnswerBody, DecisionBody, ProposalCreateBody, ProposalDto, ProposalRowDto, ProposalSummaryDto, RowPatchBody,
} from '@shared/schemas/proposals'
import type { JobDto } from '@shared/schemas/jobs'

/** Thrown when the row changed since it was read: the store already holds the new row. */
export class RowChangedMeanwhile extends Error {
  constructor(readonly row: ProposalRowDto, readonly changes: string[]) {
    super('Someone changed this row since you opened it.')
  }
}

export const useProposalsStore = defineStore('proposals', () => {
  const items = ref<ProposalSummaryDto[]>([])
  const current = ref<ProposalDto | null>(null)
  const loading = ref(false)
  const job = ref<JobDto | null>(null)

  async function loadList(corridorId?: string) {
    loading.value = true
    try { items.value = await proposalsApi.listProposals(corridorId) } finally { loading.value = false }
  }

  async function load(id: string) {
    loading.value = true
    try { current.value = await proposalsApi.getProposal(id) } finally { loading.value = false }
  }

  async function create(body: ProposalCreateBody) {
    current.value = await proposalsApi.createProposal(body)
    return current.value
  }

  function replaceRow(row: ProposalRowDto) {
    if (!current.value) return
    current.value = { ...current.value, rows: current.value.rows.map((r) => (r.id === row.id ? row : r)) }
  }

  /** Runs a row action; on a stale version keeps the server's row and says what changed. */
  async function rowAction(rowId: string, call: () => Promise<ProposalRowDto>) {
    const before = current.value?.rows.find((r) => r.id === rowId)
    try {
      const row = await call()
      replaceRow(row)
      return row
    } catch (err) {
      const now = rowFromConflict(err)
      if (now && before) {
        replaceRow(now)
        throw new RowChangedMeanwhile(now, describeRowChanges(before, now))
      }
      throw err
    }
  }

  async function patchRow(rowId: string, body: RowPatchBody) {
    const row = await rowAction(rowId, () => proposalsApi.patchRow(current.value!.id, rowId, body))
    await refreshHeader()
    return row
  }
  const decide = (rowId: string, body: DecisionBody) => rowAction(rowId, () => proposalsApi.decideRow(current.value!.id, rowId, body))
  async function answer(rowId: string, body: AnswerBody) {
    const row = await rowAction(rowId, () => proposalsApi.answerRow(current.value!.id, rowId, body))
    await refreshHeader()
    return row
  }

  /** The proposal version and counts move with row edits; reload them quietly. */
  async function refreshHeader() {
    if (current.value) current.value = await proposalsApi.getProposal(current.value.id)
  }

  async function submit(comment = '') {
    current.value = await proposalsApi.submitProposal(current.value!.id, comment)
  }

  /** Starts an evaluation and follows its job until it ends, then reloads the proposal. */
  async function evaluate(pollMs = 400) {
    const id = current.value!.id
    const { jobId } = await proposalsApi.evaluateProposal(id)
    for (;;) {
      job.value = await proposalsApi.getJob(jobId)
      if (job.value.state === 'succeeded' || job.value.state === 'failed') break
      await new Promise((r) => setTimeout(r, pollMs))
    }
    await load(id)
    return job.value
  }

  return { items, current, loading, job, loadList, load, create, patchRow, decide, answer, submit, evaluate, replaceRow }
})

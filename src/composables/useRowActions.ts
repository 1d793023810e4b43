// Dialog state for deciding, editing and answering rows, shared by the approval and proposal pages.
// A stale version keeps the dialog open with the row as it now is and the list of what changed.
import { ref } from 'vue'
import { useToast } from 'primevue/usetoast'
import { errorText } from '@/api/client'
import { RowChangedMeanwhile, useProposalsStore } from '@/stores/proposals'
import type { AnswerBody, DecisionBody, ProposalRowDto, RowPatchBody } from '@shared/schemas/proposals'
import { ROW_STATUS_LABELS } from '@shared/schemas/proposals'

export function useRowActions() {
  const store = useProposalsStore()
  const toast = useToast()
  const row = ref<ProposalRowDto | null>(null)
  const deciding = ref(false)
  const editing = ref(false)
  const editorMode = ref<'edit' | 'answer'>('edit')
  const error = ref('')
  const changes = ref<string[]>([])
  const busy = ref(false)

  function open(r: ProposalRowDto, what: 'decide' | 'edit' | 'answer') {
    row.value = r
    error.value = ''
    changes.value = []
    if (what === 'decide') deciding.value = true
    else { editorMode.value = what; editing.value = true }
  }

  async function run(call: () => Promise<ProposalRowDto>, done: string, close: () => void) {
    busy.value = true
    error.value = ''
    try {
      const updated = await call()
      changes.value = []
      close()
      toast.add({ severity: 'success', summary: done, detail: `${updated.intersectionName}: ${ROW_STATUS_LABELS[updated.status]}`, life: 4000 })
    } catch (err) {
      if (err instanceof RowChangedMeanwhile) {
        row.value = err.row
        changes.value = err.changes
      } else {
        error.value = errorText(err)
      }
    } finally {
      busy.value = false
    }
  }

  const decide = (body: DecisionBody) => run(() => store.decide(row.value!.id, body), 'Decision sent', () => { deciding.value = false })
  const save = (body: RowPatchBody) => run(() => store.patchRow(row.value!.id, body), 'Row saved', () => { editing.value = false })
  const answer = (body: AnswerBody) => run(() => store.answer(row.value!.id, body), 'Answer sent', () => { editing.value = false })

  return { row, deciding, editing, editorMode, error, changes, busy, open, decide, save, answer }
}

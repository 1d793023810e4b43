// The trade-off curve of a row and the suggested settings, for the proposal and approval pages:
// a planner puts picked or suggested settings into a draft row, an engineer sends a point picked
// on the curve as the city's counter through the decision endpoint.
import { ref } from 'vue'
import { useToast } from 'primevue/usetoast'
import { errorText } from '@/api/client'
import { suggestSettings } from '@/api/sweep'
import { RowChangedMeanwhile, useProposalsStore } from '@/stores/proposals'
import type { DayType } from '@shared/signals/time-of-day'
import type { ProposalRowDto, RowPatchBody } from '@shared/schemas/proposals'
import type { Objective, SuggestResponse, SweepSettings } from '@shared/schemas/sweep'
import { counterFrom, rowSettingsWith } from '@shared/proposals/sweep-settings'
import { settingsChanges } from '@shared/proposals/settings'

export type CurvePurpose = 'settings' | 'counter' | 'view'

export function useSweepCurve() {
  const store = useProposalsStore()
  const toast = useToast()
  const visible = ref(false)
  const row = ref<ProposalRowDto | null>(null)
  const purpose = ref<CurvePurpose>('view')
  const error = ref('')
  const busy = ref(false)
  const suggesting = ref(false)

  /** What the reader may do with the curve of this row. */
  function open(r: ProposalRowDto) {
    row.value = r
    purpose.value = r.may.decide ? 'counter' : r.may.edit ? 'settings' : 'view'
    error.value = ''
    visible.value = true
  }

  async function pick(settings: SweepSettings, comment: string) {
    const r = row.value
    if (!r) return
    busy.value = true
    error.value = ''
    try {
      if (purpose.value === 'counter') {
        const counter = counterFrom(settings, r.settings)
        if (!counter) throw new Error('The picked point changes nothing a counter can offer.')
        await store.decide(r.id, { decision: 'request-change', comment, counter, version: r.version })
        toast.add({ severity: 'success', summary: 'Change asked', detail: `${r.intersectionName}: counter sent and evaluated`, life: 4000 })
      } else {
        const next = rowSettingsWith(settings, r.settings)
        const patch: Record<string, unknown> = {}
        for (const c of settingsChanges(r.settings, next)) {
          if (c.field.startsWith('conditional.')) patch.conditional = { ...((patch.conditional as object | undefined) ?? {}), [c.field.slice(12)]: c.to }
          else patch[c.field] = c.to
        }
        await store.patchRow(r.id, { ...patch, version: r.version } as RowPatchBody)
        toast.add({ severity: 'success', summary: 'Row saved', detail: `${r.intersectionName}: settings from the curve`, life: 4000 })
      }
      visible.value = false
    } catch (err) {
      if (err instanceof RowChangedMeanwhile) {
        row.value = err.row
        error.value = `This row changed while you had it open; nothing was sent. Now: ${err.changes.join('; ') || 'its status moved on'}.`
      } else error.value = errorText(err)
    } finally {
      busy.value = false
    }
  }

  /** Fills one row (or every row the planner may still edit) with the recommendation, then reloads. */
  async function suggest(target: ProposalRowDto | null, dayType: DayType, objective: Objective = 'person-delay'): Promise<SuggestResponse | null> {
    const proposal = store.current
    if (!proposal) return null
    suggesting.value = true
    try {
      const res = await suggestSettings(proposal.id, target ? { rowId: target.id, version: target.version, dayType, objective } : { dayType, objective })
      await store.load(proposal.id)
      const applied = res.rows.filter((x) => x.applied)
      const left = res.rows.filter((x) => !x.applied)
      const detail = target
        ? (applied.length ? applied[0].recommendation!.summary : `Left as it was: ${left[0]?.skipped ?? ''}`)
        : `${applied.length} row${applied.length === 1 ? '' : 's'} filled${left.length ? `; left: ${left.map((x) => `${x.intersectionName} (${x.skipped})`).join('; ')}` : ''}.`
      toast.add({ severity: applied.length ? 'success' : 'warn', summary: target ? 'Suggested settings' : 'Suggested settings for the rows', detail, life: 9000 })
      return res
    } catch (err) {
      toast.add({ severity: 'error', summary: 'No suggestion', detail: errorText(err), life: 8000 })
      return null
    } finally {
      suggesting.value = false
    }
  }

  return { visible, row, purpose, error, busy, suggesting, open, pick, suggest }
}

// What changed in a row between the version a person read and the one the server now has, in
// words, so that a 409 can be shown as "this is what happened meanwhile" rather than an error.
import { ROW_STATUS_LABELS, STRATEGY_LABELS, type Counter, type RowSettings, type RowStatus } from '../schemas/proposals'
import { settingsChanges } from './settings'

interface RowView {
  status: RowStatus
  version: number
  settings: RowSettings
  counter: Counter | null
  lastComment: string
  history?: { rowVersion: number; actor: { name: string } | null }[]
}

export const FIELD_LABELS: Record<string, string> = {
  strategy: 'Strategy',
  maxExtensionS: 'Maximum extension',
  maxEarlyGreenS: 'Maximum early green',
  lockoutCycles: 'Lockout',
  'conditional.onlyLateBuses': 'Only late buses',
  'conditional.lateThresholdS': 'Late beyond',
  'conditional.lateShare': 'Share of late buses',
}

export function formatFieldValue(field: string, v: unknown): string {
  if (v === null || v === undefined) return '–'
  if (field === 'strategy') return STRATEGY_LABELS[v as keyof typeof STRATEGY_LABELS] ?? String(v)
  if (field === 'lockoutCycles') return `${v} cycle${v === 1 ? '' : 's'}`
  if (field === 'conditional.lateShare') return `${Math.round(Number(v) * 100)} %`
  if (typeof v === 'boolean') return v ? 'yes' : 'no'
  if (field.endsWith('S')) return `${v} s`
  return String(v)
}

const counterText = (c: Counter | null) => c
  ? Object.entries(c).filter(([, v]) => v !== undefined).map(([k, v]) => `${FIELD_LABELS[k]} ${formatFieldValue(k, v)}`).join(', ')
  : 'none'

export function describeRowChanges(before: RowView, after: RowView): string[] {
  const out: string[] = []
  const by = after.history?.filter((e) => e.rowVersion > before.version && e.actor).map((e) => e.actor!.name)
  const who = by && by.length ? ` (by ${[...new Set(by)].join(', ')})` : ''
  if (before.status !== after.status) out.push(`Status: ${ROW_STATUS_LABELS[before.status]} → ${ROW_STATUS_LABELS[after.status]}${who}`)
  for (const c of settingsChanges(before.settings, after.settings)) {
    out.push(`${FIELD_LABELS[c.field] ?? c.field}: ${formatFieldValue(c.field, c.from)} → ${formatFieldValue(c.field, c.to)}`)
  }
  if (counterText(before.counter) !== counterText(after.counter)) out.push(`Counter: ${counterText(before.counter)} → ${counterText(after.counter)}`)
  if (before.lastComment !== after.lastComment && after.lastComment) out.push(`Comment: “${after.lastComment}”`)
  if (!out.length && before.version !== after.version) out.push(`The row moved from version ${before.version} to ${after.version}${who}.`)
  return out
}

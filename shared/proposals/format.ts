// Short texts for row settings, used in the approval table, its CSV export and the e-mails.
import { STRATEGY_LABELS, type Counter, type RowSettings } from '../schemas/proposals'
import { usesEarlyGreen, usesExtension } from './settings'

const n = (x: number) => String(Number(x.toFixed(1)))

export function settingsSummary(s: RowSettings): string {
  if (s.strategy === 'none') return STRATEGY_LABELS.none
  const parts: string[] = []
  if (usesExtension(s)) parts.push(`extension up to ${n(s.maxExtensionS)} s`)
  if (usesEarlyGreen(s)) parts.push(`early green up to ${n(s.maxEarlyGreenS)} s`)
  parts.push(`lockout ${s.lockoutCycles} cycle${s.lockoutCycles === 1 ? '' : 's'}`)
  if (s.conditional.onlyLateBuses) parts.push(`late buses only (over ${n(s.conditional.lateThresholdS)} s)`)
  const text = parts.join(', ')
  return text.charAt(0).toUpperCase() + text.slice(1)
}

export function counterSummary(c: Counter | null): string {
  if (!c) return ''
  const parts: string[] = []
  if (c.maxExtensionS !== undefined) parts.push(`extension up to ${n(c.maxExtensionS)} s`)
  if (c.maxEarlyGreenS !== undefined) parts.push(`early green up to ${n(c.maxEarlyGreenS)} s`)
  if (c.lockoutCycles !== undefined) parts.push(`lockout ${c.lockoutCycles} cycle${c.lockoutCycles === 1 ? '' : 's'}`)
  const text = parts.join(', ')
  return text.charAt(0).toUpperCase() + text.slice(1)
}

/** Seconds with one decimal, or a dash for a missing figure. */
export function seconds(x: number | null | undefined, digits = 1): string {
  return x === null || x === undefined || !Number.isFinite(x) ? '–' : `${x.toFixed(digits)} s`
}

export function fixed(x: number | null | undefined, digits = 2): string {
  return x === null || x === undefined || !Number.isFinite(x) ? '–' : x.toFixed(digits)
}

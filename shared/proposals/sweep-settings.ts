// Between a proposal row's settings and the settings of a point of the trade-off sweep: what a
// suggestion writes into a row, and which counter values a point picked on the curve offers.
import type { Counter, RowSettings } from '../schemas/proposals'
import type { SweepSettings } from '../schemas/sweep'
import { usesEarlyGreen, usesExtension } from './settings'

export function sweepSettingsOf(s: RowSettings): SweepSettings {
  return { strategy: s.strategy, maxExtensionS: s.maxExtensionS, maxEarlyGreenS: s.maxEarlyGreenS, lockoutCycles: s.lockoutCycles, lateOnly: s.conditional.onlyLateBuses }
}

/** The row with a point's settings; a limit the strategy does not use keeps the row's value (no change to record). */
export function rowSettingsWith(s: SweepSettings, row: RowSettings): RowSettings {
  if (s.strategy === 'none') return { ...row, strategy: 'none', conditional: { ...row.conditional } }
  return {
    strategy: s.strategy,
    maxExtensionS: usesExtension(s) ? s.maxExtensionS : row.maxExtensionS,
    maxEarlyGreenS: usesEarlyGreen(s) ? s.maxEarlyGreenS : row.maxEarlyGreenS,
    lockoutCycles: s.lockoutCycles,
    conditional: { ...row.conditional, onlyLateBuses: s.lateOnly },
  }
}

/**
 * The counter a city offers with a point of the curve: only the values it changes. A counter
 * cannot change the strategy or the condition, so a point with others offers nothing (null).
 */
export function counterFrom(s: SweepSettings, row: RowSettings): Counter | null {
  if (s.strategy !== row.strategy || s.lateOnly !== row.conditional.onlyLateBuses || row.strategy === 'none') return null
  const c: Counter = {}
  if (usesExtension(row) && s.maxExtensionS !== row.maxExtensionS) c.maxExtensionS = s.maxExtensionS
  if (usesEarlyGreen(row) && s.maxEarlyGreenS !== row.maxEarlyGreenS) c.maxEarlyGreenS = s.maxEarlyGreenS
  if (s.lockoutCycles !== row.lockoutCycles) c.lockoutCycles = s.lockoutCycles
  return Object.keys(c).length ? c : null
}

// Merging edits and counters into row settings, and listing what changed for the row history.
import type { Counter, FieldChange, RowSettings, RowSettingsPatch } from '../schemas/proposals'

export function mergeSettings(base: RowSettings, patch: RowSettingsPatch | undefined): RowSettings {
  if (!patch) return base
  return {
    strategy: patch.strategy ?? base.strategy,
    maxExtensionS: patch.maxExtensionS ?? base.maxExtensionS,
    maxEarlyGreenS: patch.maxEarlyGreenS ?? base.maxEarlyGreenS,
    lockoutCycles: patch.lockoutCycles ?? base.lockoutCycles,
    conditional: { ...base.conditional, ...(patch.conditional ?? {}) },
  }
}

/** The proposed settings with the city's counter values in place of the proposed ones. */
export function applyCounter(base: RowSettings, counter: Counter): RowSettings {
  return mergeSettings(base, counter)
}

/** Flat field-by-field differences (conditional fields as "conditional.lateShare"). */
export function settingsChanges(before: RowSettings, after: RowSettings): FieldChange[] {
  const out: FieldChange[] = []
  for (const f of ['strategy', 'maxExtensionS', 'maxEarlyGreenS', 'lockoutCycles'] as const) {
    if (before[f] !== after[f]) out.push({ field: f, from: before[f], to: after[f] })
  }
  for (const f of ['onlyLateBuses', 'lateThresholdS', 'lateShare'] as const) {
    if (before.conditional[f] !== after.conditional[f]) out.push({ field: `conditional.${f}`, from: before.conditional[f], to: after.conditional[f] })
  }
  return out
}

export const sameSettings = (a: RowSettings, b: RowSettings) => settingsChanges(a, b).length === 0

/** The limits that matter for a strategy; the others are kept but not used. */
export function usesExtension(s: Pick<RowSettings, 'strategy'>) { return s.strategy === 'green-extension' || s.strategy === 'both' }
export function usesEarlyGreen(s: Pick<RowSettings, 'strategy'>) { return s.strategy === 'early-green' || s.strategy === 'both' }

import { describe, expect, it } from 'vitest'
import { counterFrom, rowSettingsWith, sweepSettingsOf } from '../../../shared/proposals/sweep-settings'
import { DEFAULT_ROW_SETTINGS, type RowSettings } from '../../../shared/schemas/proposals'

const row: RowSettings = { ...DEFAULT_ROW_SETTINGS, strategy: 'both', maxExtensionS: 10, maxEarlyGreenS: 8, lockoutCycles: 1 }

describe('a point of the curve and a proposal row', () => {
  it('round-trips the settings a point carries', () => {
    expect(rowSettingsWith(sweepSettingsOf(row), row)).toEqual(row)
  })

  it('writes a suggestion without touching the limit the strategy leaves unused', () => {
    const next = rowSettingsWith({ strategy: 'green-extension', maxExtensionS: 6, maxEarlyGreenS: 0, lockoutCycles: 2, lateOnly: true }, row)
    expect(next).toEqual({ ...row, strategy: 'green-extension', maxExtensionS: 6, maxEarlyGreenS: 8, lockoutCycles: 2, conditional: { ...row.conditional, onlyLateBuses: true } })
    expect(rowSettingsWith({ strategy: 'none', maxExtensionS: 0, maxEarlyGreenS: 0, lockoutCycles: 0, lateOnly: false }, row)).toEqual({ ...row, strategy: 'none' })
  })

  it('offers as counter only the limits that change, and nothing for another strategy or condition', () => {
    expect(counterFrom({ strategy: 'both', maxExtensionS: 6, maxEarlyGreenS: 8, lockoutCycles: 2, lateOnly: false }, row)).toEqual({ maxExtensionS: 6, lockoutCycles: 2 })
    expect(counterFrom({ strategy: 'both', maxExtensionS: 10, maxEarlyGreenS: 8, lockoutCycles: 1, lateOnly: false }, row)).toBeNull()
    expect(counterFrom({ strategy: 'green-extension', maxExtensionS: 6, maxEarlyGreenS: 0, lockoutCycles: 1, lateOnly: false }, row)).toBeNull()
    expect(counterFrom({ strategy: 'both', maxExtensionS: 6, maxEarlyGreenS: 8, lockoutCycles: 1, lateOnly: true }, row)).toBeNull()
  })
})

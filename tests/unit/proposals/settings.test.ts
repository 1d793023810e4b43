import { describe, expect, it } from 'vitest'
import { applyCounter, mergeSettings, sameSettings, settingsChanges } from '../../../shared/proposals/settings'
import { DEFAULT_ROW_SETTINGS, answerBody, counterSchema, decisionBody, rowPatchBody } from '../../../shared/schemas/proposals'

describe('row settings', () => {
  it('merges a partial edit, conditional fields one by one', () => {
    const s = mergeSettings(DEFAULT_ROW_SETTINGS, { maxExtensionS: 8, conditional: { onlyLateBuses: true } })
    expect(s).toEqual({ ...DEFAULT_ROW_SETTINGS, maxExtensionS: 8, conditional: { ...DEFAULT_ROW_SETTINGS.conditional, onlyLateBuses: true } })
    expect(DEFAULT_ROW_SETTINGS.maxExtensionS).toBe(10)
  })

  it('puts counter values in place of the proposed ones and lists the differences', () => {
    const c = applyCounter(DEFAULT_ROW_SETTINGS, { maxExtensionS: 6, lockoutCycles: 2 })
    expect(settingsChanges(DEFAULT_ROW_SETTINGS, c)).toEqual([
      { field: 'maxExtensionS', from: 10, to: 6 },
      { field: 'lockoutCycles', from: 1, to: 2 },
    ])
    expect(sameSettings(DEFAULT_ROW_SETTINGS, { ...DEFAULT_ROW_SETTINGS, conditional: { ...DEFAULT_ROW_SETTINGS.conditional } })).toBe(true)
    expect(settingsChanges(DEFAULT_ROW_SETTINGS, mergeSettings(DEFAULT_ROW_SETTINGS, { conditional: { lateShare: 0.5 } })))
      .toEqual([{ field: 'conditional.lateShare', from: 0.3, to: 0.5 }])
  })
})

describe('decision and answer bodies', () => {
  const issuePaths = (r: { success: boolean; error?: { issues: { path: PropertyKey[] }[] } }) => r.error?.issues.map((i) => i.path.join('.')) ?? []

  it('a refusal or a request for change must say why; an acceptance need not', () => {
    expect(decisionBody.safeParse({ decision: 'accept', version: 1 }).success).toBe(true)
    expect(issuePaths(decisionBody.safeParse({ decision: 'reject', comment: '  ', version: 1 }))).toEqual(['comment'])
  })

  it('counter values only with a request for change, and at least one of them', () => {
    expect(issuePaths(decisionBody.safeParse({ decision: 'accept', counter: { maxExtensionS: 5 }, version: 1 }))).toEqual(['counter'])
    expect(counterSchema.safeParse({}).success).toBe(false)
    expect(issuePaths(decisionBody.safeParse({ decision: 'request-change', comment: 'x', counter: { maxExtensionS: 90 }, version: 1 }))).toEqual(['counter.maxExtensionS'])
  })

  it('names the field of a bad edit and requires the version read', () => {
    expect(issuePaths(rowPatchBody.safeParse({ maxEarlyGreenS: -1, version: 2 }))).toEqual(['maxEarlyGreenS'])
    expect(issuePaths(rowPatchBody.safeParse({ maxEarlyGreenS: 5 }))).toEqual(['version'])
    expect(issuePaths(rowPatchBody.safeParse({ lockoutCycles: 1.5, version: 2 }))).toEqual(['lockoutCycles'])
    expect(issuePaths(answerBody.safeParse({ action: 'accept-counter', settings: { maxExtensionS: 4 }, version: 3 }))).toEqual(['settings'])
  })
})

describe('what changed meanwhile (shown on a 409)', () => {
  it('lists status, settings, counter and comment in words with who did it', async () => {
    const { describeRowChanges } = await import('../../../shared/proposals/row-diff')
    const before = { status: 'submitted' as const, version: 3, settings: DEFAULT_ROW_SETTINGS, counter: null, lastComment: '' }
    const after = {
      status: 'change-requested' as const, version: 4, settings: DEFAULT_ROW_SETTINGS, counter: { maxExtensionS: 6 }, lastComment: 'Keep it short at peak.',
      history: [{ rowVersion: 3, actor: { name: 'Tova Rasmussen' } }, { rowVersion: 4, actor: { name: 'Dario Fenwick' } }],
    }
    expect(describeRowChanges(before, after)).toEqual([
      'Status: Awaiting city → Change asked (by Dario Fenwick)',
      'Counter: none → Maximum extension 6 s',
      'Comment: “Keep it short at peak.”',
    ])
    expect(describeRowChanges(before, { ...before, version: 4, settings: { ...DEFAULT_ROW_SETTINGS, lockoutCycles: 2 } }))
      .toEqual(['Lockout: 1 cycle → 2 cycles'])
  })
})

import { describe, expect, it } from 'vitest'
import { canTransition, isOpen, transition, type RowAction } from '../../../shared/proposals/row-state'
import { mayDecideRow, mayPlan, rowPermissions } from '../../../shared/proposals/permissions'
import { ROW_STATUSES, type RowStatus } from '../../../shared/schemas/proposals'

const ACTIONS: RowAction[] = [
  { type: 'edit' },
  { type: 'submit' },
  { type: 'decide', decision: 'accept' },
  { type: 'decide', decision: 'reject' },
  { type: 'decide', decision: 'request-change' },
  { type: 'answer', answer: 'accept-counter', hasCounter: true },
  { type: 'answer', answer: 'accept-counter', hasCounter: false },
  { type: 'answer', answer: 'resubmit', hasCounter: false },
]
const key = (a: RowAction) => a.type === 'decide' ? `decide:${a.decision}` : a.type === 'answer' ? `answer:${a.answer}${a.hasCounter ? '+counter' : ''}` : a.type

// The whole table of allowed moves: every (status, action) pair not listed here must be refused.
const ALLOWED: Record<string, [RowStatus, string][]> = {
  draft: [['draft', 'edit'], ['submitted', 'submit']],
  submitted: [['accepted', 'decide:accept'], ['rejected', 'decide:reject'], ['change-requested', 'decide:request-change']],
  accepted: [],
  rejected: [['submitted', 'answer:resubmit']],
  'change-requested': [['change-requested', 'edit'], ['accepted', 'answer:accept-counter+counter'], ['submitted', 'answer:resubmit']],
}

describe('proposal row state machine', () => {
  for (const from of ROW_STATUSES) {
    for (const action of ACTIONS) {
      const allowed = ALLOWED[from].find(([, k]) => k === key(action))
      it(`${from} + ${key(action)} -> ${allowed ? allowed[0] : 'refused'}`, () => {
        const t = transition(from, action)
        if (allowed) {
          expect(t).toMatchObject({ ok: true, to: allowed[0] })
        } else {
          expect(t.ok).toBe(false)
          if (!t.ok) expect(t.reason).toMatch(/^Cannot /)
        }
      })
    }
  }

  it('names the event after the decision so the history reads plainly', () => {
    expect(transition('submitted', { type: 'decide', decision: 'request-change' })).toEqual({ ok: true, to: 'change-requested', kind: 'change-requested' })
    expect(transition('change-requested', { type: 'answer', answer: 'accept-counter', hasCounter: true })).toEqual({ ok: true, to: 'accepted', kind: 'counter-accepted' })
    expect(transition('rejected', { type: 'answer', answer: 'resubmit', hasCounter: false })).toEqual({ ok: true, to: 'submitted', kind: 'resubmitted' })
  })

  it('explains a refused counter acceptance when there was no counter', () => {
    const t = transition('change-requested', { type: 'answer', answer: 'accept-counter', hasCounter: false })
    expect(t.ok).toBe(false)
    if (!t.ok) expect(t.reason).toContain('without counter values')
  })

  it('a decided row cannot be decided again, so a second decision on the same version loses', () => {
    for (const s of ['accepted', 'rejected', 'change-requested'] as const) expect(canTransition(s, { type: 'decide', decision: 'accept' })).toBe(false)
  })

  it('open rows are those waiting for someone', () => {
    expect(ROW_STATUSES.filter(isOpen)).toEqual(['submitted', 'change-requested'])
  })
})

describe('who may act on a row', () => {
  const brackenfordEngineer = { role: 'engineer' as const, organisationId: 'org-brackenford' }
  const osterfieldEngineer = { role: 'engineer' as const, organisationId: 'org-osterfield' }
  const planner = { role: 'planner' as const, organisationId: 'org-lindenmere' }
  const admin = { role: 'admin' as const, organisationId: 'org-brackenford' }

  it('only an engineer of the row’s own city decides it; not even an admin of that city', () => {
    expect(mayDecideRow(brackenfordEngineer, 'org-brackenford')).toBe(true)
    expect(mayDecideRow(osterfieldEngineer, 'org-brackenford')).toBe(false)
    expect(mayDecideRow(planner, 'org-brackenford')).toBe(false)
    expect(mayDecideRow(admin, 'org-brackenford')).toBe(false)
  })

  it('only planners plan', () => {
    expect(mayPlan(planner)).toBe(true)
    expect(mayPlan(brackenfordEngineer)).toBe(false)
    expect(mayPlan({ role: 'manager', organisationId: 'org-lindenmere' })).toBe(false)
  })

  it('combines role, city and status', () => {
    const row = { status: 'submitted' as const, jurisdictionId: 'org-brackenford', counter: null }
    expect(rowPermissions(brackenfordEngineer, row)).toEqual({ edit: false, decide: true, answer: false })
    expect(rowPermissions(osterfieldEngineer, row)).toEqual({ edit: false, decide: false, answer: false })
    expect(rowPermissions(planner, row)).toEqual({ edit: false, decide: false, answer: false })
    expect(rowPermissions(planner, { ...row, status: 'change-requested', counter: { maxExtensionS: 6 } })).toEqual({ edit: true, decide: false, answer: true })
    expect(rowPermissions(planner, { ...row, status: 'draft' })).toEqual({ edit: true, decide: false, answer: false })
    expect(rowPermissions(brackenfordEngineer, { ...row, status: 'accepted' })).toEqual({ edit: false, decide: false, answer: false })
  })
})

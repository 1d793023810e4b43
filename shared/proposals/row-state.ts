// The life of one proposal row, as a pure state machine shared by the server (which enforces it)
// and the client (which offers only the actions that can succeed):
//
//   draft --submit--> submitted --accept--> accepted
//     ^ edit            |  ^  \--reject--> rejected ---resubmit--+
//                       |  |                                     |
//                       |  +------------resubmit-----------------+
//                       |  +------------resubmit---------------+ |
//                       +--request-change--> change-requested -+-+--accept-counter--> accepted
//                                             ^ edit
//
// Only the planner edits (draft and change-requested rows), submits and answers; only an engineer
// of the row's city decides a submitted row. An accepted row is closed: a new proposal reopens it.
import type { Answer, Decision, RowEventKind, RowStatus } from '../schemas/proposals'

export type RowAction =
  | { type: 'edit' }
  | { type: 'submit' }
  | { type: 'decide'; decision: Decision }
  | { type: 'answer'; answer: Answer; hasCounter: boolean }

export type Transition =
  | { ok: true; to: RowStatus; kind: RowEventKind }
  | { ok: false; reason: string }

const DECISION_TARGET: Record<Decision, RowStatus & RowEventKind> = {
  accept: 'accepted',
  reject: 'rejected',
  'request-change': 'change-requested',
}

const WHY_NOT: Record<RowStatus, string> = {
  draft: 'the row is still a draft',
  submitted: 'the row is waiting for the city’s decision',
  accepted: 'the row is already agreed',
  rejected: 'the city refused the row',
  'change-requested': 'the city asked for a change',
}

const no = (what: string, from: RowStatus): Transition => ({ ok: false, reason: `Cannot ${what}: ${WHY_NOT[from]}.` })

export function transition(from: RowStatus, action: RowAction): Transition {
  switch (action.type) {
    case 'edit':
      return from === 'draft' || from === 'change-requested' ? { ok: true, to: from, kind: 'edited' } : no('edit the row', from)
    case 'submit':
      return from === 'draft' ? { ok: true, to: 'submitted', kind: 'submitted' } : no('submit the row', from)
    case 'decide':
      return from === 'submitted'
        ? { ok: true, to: DECISION_TARGET[action.decision], kind: DECISION_TARGET[action.decision] }
        : no('decide the row', from)
    case 'answer':
      if (action.answer === 'accept-counter') {
        if (from !== 'change-requested') return no('accept a counter', from)
        if (!action.hasCounter) return { ok: false, reason: 'Cannot accept a counter: the city asked for a change without counter values; revise and resubmit.' }
        return { ok: true, to: 'accepted', kind: 'counter-accepted' }
      }
      return from === 'change-requested' || from === 'rejected'
        ? { ok: true, to: 'submitted', kind: 'resubmitted' }
        : no('resubmit the row', from)
  }
}

export const canTransition = (from: RowStatus, action: RowAction) => transition(from, action).ok

/** Rows still waiting for someone: the city (submitted) or the planner (change-requested). */
export function isOpen(status: RowStatus): boolean {
  return status === 'submitted' || status === 'change-requested'
}

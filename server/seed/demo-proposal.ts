// The demo's negotiation, half-way: one proposal on the demo corridor, evaluated and submitted,
// in each city some rows decided (agreed, refused, a counter offered) with the engineers'
// comments, and some still waiting for that city's engineer. Idempotent: once the proposal
// exists nothing is changed. Skipped when the demo corridor is not there.
import { and, eq, inArray, sql } from 'drizzle-orm'
import type { User } from 'lucia'
import type { Db } from '../db'
import { corridorApproaches, corridors, proposalEvaluations, proposalRowEvents, proposals, users } from '../db/schema'
import type { Mailer } from '../services/mail'
import { createProposal, submitProposal } from '../services/proposals/proposals'
import { decideRow, patchRow } from '../services/proposals/rows'
import { evaluateProposalNow, newEvaluation } from '../services/proposals/evaluation'
import { proposalRecord } from '../services/proposals/records'
import type { DecisionBody, RowSettings } from '../../shared/schemas/proposals'
import { usesExtension } from '../../shared/proposals/settings'

export const DEMO_CORRIDOR_NAME = 'Kestrel Avenue eastbound'
export const DEMO_PROPOSAL_NAME = 'Kestrel Avenue priority, first round'

// The demo's history is not news: nobody is mailed about it.
const quietMailer: Mailer = { send: async () => {}, close: () => {} }

async function actor(db: Db, id: string): Promise<User> {
  const [u] = await db.select().from(users).where(eq(users.id, id))
  return { id: u.id, email: u.email, name: u.name, role: u.role, organisationId: u.organisationId, active: u.active }
}

interface Step { decision: DecisionBody['decision']; comment: string; counter?: (s: RowSettings) => DecisionBody['counter'] }

// Per city, the decisions taken so far, in corridor order; the city's remaining rows wait.
const STEPS: Record<string, Step[]> = {
  'org-brackenford': [
    { decision: 'accept', comment: 'Fits our AM and PM plans. We will program it with the spring timing update.' },
    {
      decision: 'request-change',
      comment: 'In the PM peak the side street already queues back past the school entrance. We can give half of it, with two cycles of lockout.',
      // Half the proposed limit, on whichever kind of priority the row uses.
      counter: (s) => (usesExtension(s)
        ? { maxExtensionS: Math.max(2, Math.round(s.maxExtensionS / 2)), lockoutCycles: 2 }
        : { maxEarlyGreenS: Math.max(2, Math.round(s.maxEarlyGreenS / 2)), lockoutCycles: 2 }),
    },
  ],
  'org-osterfield': [
    { decision: 'reject', comment: 'Pedestrian flows across this approach are heavy all day; we will not take green from the crossing phase here.' },
    { decision: 'accept', comment: 'Agreed as proposed. Please keep the lockout at one cycle.' },
  ],
}

export async function seedDemoProposal(db: Db): Promise<void> {
  const [corridor] = await db.select().from(corridors).where(eq(corridors.name, DEMO_CORRIDOR_NAME))
  if (!corridor) return
  const [existing] = await db.select({ id: proposals.id }).from(proposals)
    .where(and(eq(proposals.corridorId, corridor.id), eq(proposals.name, DEMO_PROPOSAL_NAME)))
  if (existing) return

  const planner = await actor(db, 'user-planner')
  const engineers: Record<string, User> = { 'org-brackenford': await actor(db, 'user-engineer'), 'org-osterfield': await actor(db, 'user-engineer2') }
  let p
  try {
    p = await createProposal(db, planner, {
      corridorId: corridor.id, name: DEMO_PROPOSAL_NAME,
      notes: 'Green extension and early green on the Kestrel Avenue signals for every bus on the corridor; conditional priority to follow once realtime data are in.',
    })
  } catch (err) {
    // A corridor without signals yet: nothing to propose on.
    console.warn('demo proposal skipped:', err instanceof Error ? err.message : err)
    return
  }

  // Rows start at 10 s each way, lowered to what each signal's plans can spare. A near-side stop
  // makes the bus's arrival at the line uncertain (its dwell comes first), so an extension is
  // often wasted there: the planner starts the green early instead.
  for (const row of p.rows) {
    const [approach] = await db.select({ stopRelation: corridorApproaches.stopRelation }).from(corridorApproaches).where(eq(corridorApproaches.id, row.approachId))
    if (approach?.stopRelation === 'near-side' && row.settings.strategy === 'both') {
      await patchRow(db, planner, p.id, row.id, { strategy: 'early-green', version: row.version })
    }
  }
  const record = await proposalRecord(db, p.id)
  await evaluateProposalNow(db, p.id, await newEvaluation(db, record, 'proposal', planner.id))
  p = await submitProposal(db, quietMailer, planner, p.id, 'First round for the Kestrel Avenue signals; figures from the current timetable.', '')

  for (const [cityId, steps] of Object.entries(STEPS)) {
    const mine = p.rows.filter((r) => r.jurisdictionId === cityId)
    // Leave at least one row of each city waiting for its engineer.
    for (const [i, row] of mine.slice(0, Math.max(0, mine.length - 1)).entries()) {
      const step = steps[i]
      if (!step) break
      const counter = step.counter?.(row.settings)
      try {
        await decideRow(db, quietMailer, engineers[cityId], p.id, row.id, { decision: step.decision, comment: step.comment, counter, version: row.version }, '')
      } catch {
        // A counter this signal cannot give: ask for the change in words only.
        await decideRow(db, quietMailer, engineers[cityId], p.id, row.id, { decision: step.decision, comment: step.comment, version: row.version }, '')
      }
    }
  }
  await backdate(db, p.id)
}

/** Spreads the history over the past days so that it reads like a negotiation in progress. */
async function backdate(db: Db, proposalId: string) {
  const days = (n: number) => sql`now() - ${`${n} days`}::interval`
  await db.update(proposals).set({ createdAt: days(9), submittedAt: days(7) }).where(eq(proposals.id, proposalId))
  await db.update(proposalEvaluations).set({ createdAt: days(7.1), finishedAt: days(7.1) })
    .where(and(eq(proposalEvaluations.proposalId, proposalId), eq(proposalEvaluations.kind, 'proposal')))
  const shift: Record<string, number> = { created: 9, edited: 8, submitted: 7 }
  for (const [kind, n] of Object.entries(shift)) {
    await db.update(proposalRowEvents).set({ at: days(n) })
      .where(and(eq(proposalRowEvents.proposalId, proposalId), eq(proposalRowEvents.kind, kind as 'created')))
  }
  await db.update(proposalRowEvents).set({ at: sql`${proposalRowEvents.at} - interval '2 days' - (${proposalRowEvents.id} % 24) * interval '1 hour'` })
    .where(and(eq(proposalRowEvents.proposalId, proposalId), inArray(proposalRowEvents.kind, ['accepted', 'rejected', 'change-requested'])))
  // Counter runs are as old as the requests for change they answer.
  await db.update(proposalEvaluations).set({ createdAt: days(2), finishedAt: days(2) })
    .where(and(eq(proposalEvaluations.proposalId, proposalId), eq(proposalEvaluations.kind, 'counter')))
}

// E-mails of the negotiation: the cities hear of rows sent to them, the planner of each decision.
// A mail that cannot be sent is logged and does not undo the decision it reports.
import type { User } from 'lucia'
import type { Mailer, MailMessage } from '../mail'
import { ROW_STATUS_LABELS, type ProposalDto, type ProposalRowDto } from '../../../shared/schemas/proposals'
import { counterSummary, settingsSummary } from '../../../shared/proposals/format'
import { activeEngineersOf, userById, type DbOrTx } from './records'

async function sendAll(mailer: Mailer, messages: MailMessage[]) {
  for (const m of messages) {
    try {
      await mailer.send(m)
    } catch (err) {
      console.error(`mail to ${m.to} failed:`, err instanceof Error ? err.message : err)
    }
  }
}

const link = (baseUrl: string, proposalId: string) => `${baseUrl}/agreement?proposal=${encodeURIComponent(proposalId)}`

export async function notifySubmitted(db: DbOrTx, mailer: Mailer, p: ProposalDto, rowIds: string[], by: User, comment: string, baseUrl: string) {
  const rows = p.rows.filter((r) => rowIds.includes(r.id))
  const cities = [...new Set(rows.map((r) => r.jurisdictionId))]
  const engineers = await activeEngineersOf(db, cities)
  await sendAll(mailer, engineers.map((e) => {
    const mine = rows.filter((r) => r.jurisdictionId === e.organisationId)
    return {
      to: e.email,
      subject: `Priority proposal "${p.name}" awaits your decision`,
      text: `Hello ${e.name},\n\n${by.name} submitted the priority proposal "${p.name}" on ${p.corridorName}. ` +
        `${mine.length} row${mine.length === 1 ? '' : 's'} at your city's intersections await your decision:\n\n` +
        mine.map((r) => `  ${r.position}. ${r.intersectionName}: ${settingsSummary(r.settings)}`).join('\n') +
        (comment ? `\n\nComment: ${comment}` : '') +
        `\n\nReview them in the approval table:\n${link(baseUrl, p.id)}\n\n` +
        'The figures are planning estimates; check every change against local codes and pedestrian clearance rules.\n',
    }
  }))
}

export async function notifyDecision(db: DbOrTx, mailer: Mailer, p: { id: string; name: string; createdBy: string | null; submittedBy: string | null },
  row: ProposalRowDto, by: User, cityName: string, comment: string, baseUrl: string) {
  const people = new Map<string, { email: string; name: string }>()
  for (const id of [p.submittedBy, p.createdBy]) {
    const u = await userById(db, id)
    if (u?.active) people.set(u.id, u)
  }
  const verb: Partial<Record<ProposalRowDto['status'], string>> = { accepted: 'agreed', rejected: 'refused', 'change-requested': 'asks for a change' }
  await sendAll(mailer, [...people.values()].map((u) => ({
    to: u.email,
    subject: `${cityName} ${verb[row.status] ?? ROW_STATUS_LABELS[row.status].toLowerCase()}: ${row.intersectionName}`,
    text: `Hello ${u.name},\n\n${by.name} (${cityName}) decided row ${row.position}, ${row.intersectionName}, of "${p.name}": ${ROW_STATUS_LABELS[row.status]}.\n` +
      `Proposed: ${settingsSummary(row.settings)}\n` +
      (row.counter ? `Counter values: ${counterSummary(row.counter)}\n` : '') +
      (comment ? `Comment: ${comment}\n` : '') +
      `\nOpen the approval table:\n${link(baseUrl, p.id)}\n`,
  })))
}

export async function notifyAnswer(db: DbOrTx, mailer: Mailer, p: { id: string; name: string }, row: ProposalRowDto, by: User, comment: string, baseUrl: string) {
  const engineers = await activeEngineersOf(db, [row.jurisdictionId])
  const what = row.status === 'accepted' ? 'took your counter values; the row is agreed' : 'revised the row and sent it back for your decision'
  await sendAll(mailer, engineers.map((e) => ({
    to: e.email,
    subject: `${row.intersectionName}: ${row.status === 'accepted' ? 'counter accepted' : 'revised for your decision'}`,
    text: `Hello ${e.name},\n\n${by.name} ${what} (row ${row.position}, ${row.intersectionName}, of "${p.name}").\n` +
      `Settings now: ${settingsSummary(row.settings)}\n` + (comment ? `Comment: ${comment}\n` : '') +
      `\nOpen the approval table:\n${link(baseUrl, p.id)}\n`,
  })))
}

import { Router } from 'express'
import type { AppContext } from '../context'
import { validate } from '../middleware/validate'
import { currentUser, requireAuth, requireRole } from '../auth/middleware'
import { createProposal, getProposal, listProposals, submitProposal } from '../services/proposals/proposals'
import { answerRow, decideRow, patchRow } from '../services/proposals/rows'
import { startEvaluation } from '../services/proposals/evaluation'
import { storedResults } from '../services/proposals/results'
import {
  answerBody, decisionBody, proposalCreateBody, proposalListQuery, proposalParams, proposalRowParams, rowPatchBody, submitBody,
} from '../../shared/schemas/proposals'

// Every signed-in role reads the proposals it may see (engineers: submitted ones touching their
// city); planners draft, evaluate, submit and answer; engineers decide their own city's rows.
export function proposalsRouter(ctx: AppContext): Router {
  const r = Router()
  const { db, mailer } = ctx
  const planner = requireRole('planner')
  const engineer = requireRole('engineer')
  r.use(requireAuth)

  r.get('/', validate({ query: proposalListQuery }), async (req, res) => {
    res.json(await listProposals(db, currentUser(res.locals), req.query as { corridorId?: string }))
  })
  r.post('/', planner, validate({ body: proposalCreateBody }), async (req, res) => {
    res.status(201).json(await createProposal(db, currentUser(res.locals), req.body))
  })
  r.get('/:id', validate({ params: proposalParams }), async (req, res) => {
    res.json(await getProposal(db, currentUser(res.locals), req.params.id as string))
  })
  r.post('/:id/evaluate', planner, validate({ params: proposalParams }), async (req, res) => {
    res.status(202).json(await startEvaluation(db, currentUser(res.locals), req.params.id as string))
  })
  r.post('/:id/submit', planner, validate({ params: proposalParams, body: submitBody }), async (req, res) => {
    res.json(await submitProposal(db, mailer, currentUser(res.locals), req.params.id as string, req.body.comment, ctx.publicUrl(req)))
  })
  r.patch('/:id/rows/:rowId', planner, validate({ params: proposalRowParams, body: rowPatchBody }), async (req, res) => {
    res.json(await patchRow(db, currentUser(res.locals), req.params.id as string, req.params.rowId as string, req.body))
  })
  r.post('/:id/rows/:rowId/decision', engineer, validate({ params: proposalRowParams, body: decisionBody }), async (req, res) => {
    res.json(await decideRow(db, mailer, currentUser(res.locals), req.params.id as string, req.params.rowId as string, req.body, ctx.publicUrl(req)))
  })
  r.post('/:id/rows/:rowId/answer', planner, validate({ params: proposalRowParams, body: answerBody }), async (req, res) => {
    res.json(await answerRow(db, mailer, currentUser(res.locals), req.params.id as string, req.params.rowId as string, req.body, ctx.publicUrl(req)))
  })
  r.get('/:id/rows/:rowId/results', validate({ params: proposalRowParams }), async (req, res) => {
    res.json(await storedResults(db, currentUser(res.locals), req.params.id as string, req.params.rowId as string))
  })
  return r
}

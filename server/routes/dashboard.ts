import { Router } from 'express'
import type { AppContext } from '../context'
import { validate } from '../middleware/validate'
import { currentUser, requireRole } from '../auth/middleware'
import { dashboard, proposalReport } from '../services/savings/dashboard'
import { getInputs, putInputs } from '../services/savings/inputs'
import { dashboardQuery, inputsQuery, reportParams, reportQuery, savingsInputsBody, type DashboardQuery } from '../../shared/schemas/savings'

// The agency's roles read the savings (managers only read); planners and admins set the inputs.
export function dashboardRouter(ctx: AppContext): Router {
  const r = Router()
  const { db } = ctx
  const readers = requireRole('planner', 'manager', 'admin')
  const year = () => ctx.clock.now().getUTCFullYear()

  r.get('/', readers, validate({ query: dashboardQuery }), async (req, res) => {
    res.json(await dashboard(db, currentUser(res.locals), req.query as DashboardQuery, ctx.clock.now()))
  })
  r.get('/inputs', readers, validate({ query: inputsQuery }), async (req, res) => {
    res.json(await getInputs(db, currentUser(res.locals), (req.query as { corridorId?: string }).corridorId, year()))
  })
  r.put('/inputs', requireRole('planner', 'admin'), validate({ body: savingsInputsBody }), async (req, res) => {
    res.json(await putInputs(db, currentUser(res.locals), req.body, year()))
  })
  return r
}

/**
 * GET /api/proposals/:id/report, mounted at /api/proposals ahead of the proposals router; it
 * answers that one path and passes every other request on.
 */
export function proposalReportRouter(ctx: AppContext): Router {
  const r = Router()
  r.get('/:id/report', requireRole('planner', 'manager', 'admin', 'engineer'), validate({ params: reportParams, query: reportQuery }), async (req, res) => {
    const from = (req.query as { from?: string }).from
    res.json(await proposalReport(ctx.db, currentUser(res.locals), req.params.id as string, from, ctx.clock.now()))
  })
  return r
}

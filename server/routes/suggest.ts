import { Router } from 'express'
import type { AppContext } from '../context'
import { validate } from '../middleware/validate'
import { currentUser, requireAuth, requireRole } from '../auth/middleware'
import { suggestSettings } from '../services/suggest'
import { proposalParams } from '../../shared/schemas/proposals'
import { suggestBody } from '../../shared/schemas/sweep'

/** Suggested settings for one row or all rows of a proposal: the agency's planners only. */
export function suggestRouter(ctx: AppContext): Router {
  const r = Router()
  r.use(requireAuth)
  r.post('/:id/suggest', requireRole('planner'), validate({ params: proposalParams, body: suggestBody }), async (req, res) => {
    res.json(await suggestSettings(ctx.db, currentUser(res.locals), req.params.id as string, req.body))
  })
  return r
}

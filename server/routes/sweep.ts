import { Router } from 'express'
import type { AppContext } from '../context'
import { validate } from '../middleware/validate'
import { requireAuth } from '../auth/middleware'
import { runSweep } from '../services/sweep'
import { sweepBody } from '../../shared/schemas/sweep'

/** The trade-off sweep of one approach, for any signed-in role. */
export function sweepRouter(ctx: AppContext): Router {
  const r = Router()
  r.use(requireAuth)
  r.post('/', validate({ body: sweepBody }), async (req, res) => { res.json(await runSweep(ctx.db, req.body)) })
  return r
}

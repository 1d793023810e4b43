import { Router } from 'express'
import type { AppContext } from '../context'
import { requireAuth } from '../auth/middleware'
import { validate } from '../middleware/validate'
import { getJob } from '../services/jobs'
import { idParams } from '../../shared/schemas/auth'

export function jobsRouter(ctx: AppContext): Router {
  const r = Router()
  r.get('/:id', requireAuth, validate({ params: idParams }), async (req, res) => {
    res.json(await getJob(ctx.db, req.params.id as string))
  })
  return r
}

import { Router } from 'express'
import { validate } from '../middleware/validate'
import { requireAuth } from '../auth/middleware'
import { evaluateApproachRequest, timeSpaceRequest } from '../services/model'
import { approachBody, timeSpaceBody } from '../../shared/schemas/model'

/** The approach model, for any signed-in role. */
export function modelRouter(): Router {
  const r = Router()
  r.use(requireAuth)
  r.post('/approach', validate({ body: approachBody }), (req, res) => { res.json(evaluateApproachRequest(req.body)) })
  r.post('/time-space', validate({ body: timeSpaceBody }), (req, res) => { res.json(timeSpaceRequest(req.body)) })
  return r
}

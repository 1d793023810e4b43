import { Router } from 'express'
import type { AppContext } from '../context'
import { validate } from '../middleware/validate'
import { currentUser, requireAuth, requireRole } from '../auth/middleware'
import { getCityLimits, putCityLimits } from '../services/city-limits'
import { cityLimitsPutBody, cityParams } from '../../shared/schemas/city-limits'

/** A city's limits for priority: everyone signed in reads them; its engineers or an admin write. */
export function citiesRouter(ctx: AppContext): Router {
  const r = Router()
  const { db } = ctx
  r.use(requireAuth)
  r.get('/:orgId/limits', validate({ params: cityParams }), async (req, res) => {
    res.json(await getCityLimits(db, req.params.orgId as string))
  })
  r.put('/:orgId/limits', requireRole('engineer', 'admin'), validate({ params: cityParams, body: cityLimitsPutBody }), async (req, res) => {
    res.json(await putCityLimits(db, currentUser(res.locals), req.params.orgId as string, req.body))
  })
  return r
}

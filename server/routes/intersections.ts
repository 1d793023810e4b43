import { Router } from 'express'
import type { AppContext } from '../context'
import { validate } from '../middleware/validate'
import { currentUser, requireAuth, requireRole } from '../auth/middleware'
import { createIntersection, deleteIntersection, getIntersection, listIntersections, patchIntersection } from '../services/signals/intersections'
import { createTimingPlan, deleteTimingPlan, listTimingPlans, patchTimingPlan } from '../services/signals/timing-plans'
import { importSignalsCsv, signalsCsvTemplate } from '../services/signals/signals-csv'
import { csvUpload, sendCsv, uploadedCsvText } from './csv-upload'
import {
  intersectionBody, intersectionListQuery, intersectionParams, intersectionPatchBody, timingPlanBody, timingPlanParams,
  timingPlanPatchBody, versionQuery,
} from '../../shared/schemas/signals'

// Everyone signed in reads signals; engineers (of the owning city, checked in the services) and
// admins change them.
export function intersectionsRouter(ctx: AppContext): Router {
  const r = Router()
  const { db } = ctx
  const editors = requireRole('engineer', 'admin')
  r.use(requireAuth)

  r.get('/', validate({ query: intersectionListQuery }), async (req, res) => {
    res.json(await listIntersections(db, req.query as { jurisdictionId?: string; q?: string }))
  })
  r.get('/import/template', (_req, res) => { sendCsv(res, 'fanlight-signals-template.csv', signalsCsvTemplate()) })
  r.post('/import', editors, csvUpload, async (req, res) => {
    res.json(await importSignalsCsv(db, currentUser(res.locals), uploadedCsvText(req)))
  })
  r.post('/', editors, validate({ body: intersectionBody }), async (req, res) => {
    res.status(201).json(await createIntersection(db, currentUser(res.locals), req.body))
  })
  r.get('/:id', validate({ params: intersectionParams }), async (req, res) => {
    res.json(await getIntersection(db, req.params.id as string))
  })
  r.patch('/:id', editors, validate({ params: intersectionParams, body: intersectionPatchBody }), async (req, res) => {
    res.json(await patchIntersection(db, currentUser(res.locals), req.params.id as string, req.body))
  })
  r.delete('/:id', editors, validate({ params: intersectionParams, query: versionQuery }), async (req, res) => {
    await deleteIntersection(db, currentUser(res.locals), req.params.id as string, (req.query as { version?: number }).version)
    res.status(204).end()
  })

  r.get('/:id/plans', validate({ params: intersectionParams }), async (req, res) => {
    res.json(await listTimingPlans(db, req.params.id as string))
  })
  r.post('/:id/plans', editors, validate({ params: intersectionParams, body: timingPlanBody }), async (req, res) => {
    res.status(201).json(await createTimingPlan(db, currentUser(res.locals), req.params.id as string, req.body))
  })
  r.patch('/:id/plans/:planId', editors, validate({ params: timingPlanParams, body: timingPlanPatchBody }), async (req, res) => {
    res.json(await patchTimingPlan(db, currentUser(res.locals), req.params.id as string, req.params.planId as string, req.body))
  })
  r.delete('/:id/plans/:planId', editors, validate({ params: timingPlanParams, query: versionQuery }), async (req, res) => {
    await deleteTimingPlan(db, currentUser(res.locals), req.params.id as string, req.params.planId as string, (req.query as { version?: number }).version)
    res.status(204).end()
  })
  return r
}

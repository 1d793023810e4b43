import { Router } from 'express'
import type { AppContext } from '../context'
import { validate } from '../middleware/validate'
import { currentUser, requireAuth, requireRole } from '../auth/middleware'
import { createCorridor, deleteCorridor, getCorridor, listCorridors, patchCorridor } from '../services/corridors/corridors'
import { createApproach, deleteApproach, getApproach, listApproaches, patchApproach } from '../services/corridors/approaches'
import { approachesCsvTemplate, importApproachesCsv } from '../services/corridors/approaches-csv'
import { csvUpload, sendCsv, uploadedCsvText } from './csv-upload'
import {
  approachCreateBody, approachParams, approachPatchBody, corridorCreateBody, corridorListQuery, corridorParams, corridorPatchBody,
} from '../../shared/schemas/corridors'
import { versionQuery } from '../../shared/schemas/signals'

// Everyone signed in reads corridors; the agency's planners (checked in the services) and admins
// define them and keep their approach data.
export function corridorsRouter(ctx: AppContext): Router {
  const r = Router()
  const { db } = ctx
  const editors = requireRole('planner', 'admin')
  const id = (p: unknown) => (p as { id: string }).id
  const aid = (p: unknown) => (p as { aid: string }).aid
  const version = (q: unknown) => (q as { version?: number }).version
  r.use(requireAuth)

  r.get('/', validate({ query: corridorListQuery }), async (req, res) => {
    res.json(await listCorridors(db, req.query as { feedId?: number }))
  })
  r.post('/', editors, validate({ body: corridorCreateBody }), async (req, res) => {
    res.status(201).json(await createCorridor(db, currentUser(res.locals), req.body))
  })
  r.get('/approaches/import/template', (_req, res) => { sendCsv(res, 'fanlight-approaches-template.csv', approachesCsvTemplate()) })
  r.get('/:id', validate({ params: corridorParams }), async (req, res) => { res.json(await getCorridor(db, id(req.params))) })
  r.patch('/:id', editors, validate({ params: corridorParams, body: corridorPatchBody }), async (req, res) => {
    res.json(await patchCorridor(db, currentUser(res.locals), id(req.params), req.body))
  })
  r.delete('/:id', editors, validate({ params: corridorParams, query: versionQuery }), async (req, res) => {
    await deleteCorridor(db, currentUser(res.locals), id(req.params), version(req.query))
    res.status(204).end()
  })

  r.get('/:id/approaches', validate({ params: corridorParams }), async (req, res) => { res.json(await listApproaches(db, id(req.params))) })
  r.post('/:id/approaches/import', editors, validate({ params: corridorParams }), csvUpload, async (req, res) => {
    res.json(await importApproachesCsv(db, currentUser(res.locals), id(req.params), uploadedCsvText(req)))
  })
  r.post('/:id/approaches', editors, validate({ params: corridorParams, body: approachCreateBody }), async (req, res) => {
    res.status(201).json(await createApproach(db, currentUser(res.locals), id(req.params), req.body))
  })
  r.get('/:id/approaches/:aid', validate({ params: approachParams }), async (req, res) => {
    res.json(await getApproach(db, id(req.params), aid(req.params)))
  })
  r.patch('/:id/approaches/:aid', editors, validate({ params: approachParams, body: approachPatchBody }), async (req, res) => {
    res.json(await patchApproach(db, currentUser(res.locals), id(req.params), aid(req.params), req.body))
  })
  r.delete('/:id/approaches/:aid', editors, validate({ params: approachParams, query: versionQuery }), async (req, res) => {
    await deleteApproach(db, currentUser(res.locals), id(req.params), aid(req.params), version(req.query))
    res.status(204).end()
  })
  return r
}

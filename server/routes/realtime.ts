import { Router } from 'express'
import multer from 'multer'
import type { AppContext } from '../context'
import { validate } from '../middleware/validate'
import { currentUser, requireRole } from '../auth/middleware'
import { uploadSnapshots } from '../services/realtime/snapshots'
import { createSource, deleteSource, listSources, pollSourceNow } from '../services/realtime/sources'
import { corridorObservations } from '../services/realtime/observations'
import { corridorLateness } from '../services/realtime/lateness'
import { corridorCalibration } from '../services/realtime/calibration'
import { corridorBeforeAfter } from '../services/realtime/before-after'
import { demoFeedUrl } from '../services/realtime/demo-feed'
import { corridorCoverage } from '../services/realtime/coverage'
import {
  beforeAfterQuery, calibrationQuery, corridorQuery, latenessQuery, observationsQuery, realtimeSourceBody, realtimeSourceParams, realtimeUploadFields,
  type BeforeAfterQuery,
} from '../../shared/schemas/realtime'

// Snapshots in memory: FeedMessages are small and each file is decoded whole anyway.
const snapshotUpload = multer({ storage: multer.memoryStorage(), limits: { fileSize: 200 * 1024 * 1024, files: 5000 } }).array('files')

interface RangeQuery { corridorId: string; from?: string; to?: string }

// Planners (and admins) bring data in; every role reads what it shows, as on the corridor pages.
export function realtimeRouter(ctx: AppContext): Router {
  const r = Router()
  const { db, clock } = ctx
  const loaders = requireRole('planner', 'admin')
  const readers = requireRole('planner', 'engineer', 'manager', 'admin')

  r.post('/snapshots', loaders, snapshotUpload, validate({ body: realtimeUploadFields }), async (req, res) => {
    const files = ((req.files ?? []) as Express.Multer.File[]).map((f) => ({ name: f.originalname, data: new Uint8Array(f.buffer) }))
    const out = await uploadSnapshots(db, clock, currentUser(res.locals), files, (req.body as { feedVersionId?: number }).feedVersionId)
    res.status('jobId' in out ? 202 : 200).json(out)
  })

  r.get('/demo-feed', loaders, (_req, res) => { res.json({ url: demoFeedUrl() }) })
  r.get('/sources', requireRole('planner', 'manager', 'admin'), async (_req, res) => {
    res.json(await listSources(db, currentUser(res.locals)))
  })
  r.post('/sources', loaders, validate({ body: realtimeSourceBody }), async (req, res) => {
    res.status(201).json(await createSource(db, currentUser(res.locals), req.body))
  })
  r.post('/sources/:id/poll', loaders, validate({ params: realtimeSourceParams }), async (req, res) => {
    res.json(await pollSourceNow(db, clock, currentUser(res.locals), req.params.id as string))
  })
  r.delete('/sources/:id', loaders, validate({ params: realtimeSourceParams }), async (req, res) => {
    await deleteSource(db, currentUser(res.locals), req.params.id as string)
    res.status(204).end()
  })

  r.get('/coverage', readers, validate({ query: corridorQuery }), async (req, res) => {
    res.json(await corridorCoverage(db, (req.query as unknown as { corridorId: string }).corridorId))
  })
  r.get('/observations', readers, validate({ query: observationsQuery }), async (req, res) => {
    const q = req.query as unknown as RangeQuery
    res.json(await corridorObservations(db, q.corridorId, q.from, q.to))
  })
  r.get('/lateness', readers, validate({ query: latenessQuery }), async (req, res) => {
    const q = req.query as unknown as RangeQuery & { lateThresholdS: number }
    res.json(await corridorLateness(db, q.corridorId, q.from, q.to, q.lateThresholdS))
  })
  r.get('/calibration', readers, validate({ query: calibrationQuery }), async (req, res) => {
    const q = req.query as unknown as RangeQuery
    res.json(await corridorCalibration(db, q.corridorId, q.from, q.to))
  })
  r.get('/before-after', readers, validate({ query: beforeAfterQuery }), async (req, res) => {
    res.json(await corridorBeforeAfter(db, req.query as unknown as BeforeAfterQuery))
  })
  return r
}

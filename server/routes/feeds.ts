import { mkdirSync } from 'node:fs'
import { rm } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import path from 'node:path'
import { Router, type ErrorRequestHandler } from 'express'
import multer from 'multer'
import type { AppContext } from '../context'
import { currentUser, requireRole } from '../auth/middleware'
import { validate } from '../middleware/validate'
import { Unprocessable } from '../errors'
import { DEFAULT_GTFS_LIMITS } from '../services/gtfs/limits'
import { deleteFeed, feedRoutes, feedShape, getFeed, listFeeds, startFeedImport } from '../services/feeds'
import { feedIdParams, feedShapeParams, feedUploadBody } from '../../shared/schemas/gtfs'

export function feedsRouter(ctx: AppContext): Router {
  const limits = { ...DEFAULT_GTFS_LIMITS, ...ctx.gtfsLimits }
  const dest = path.join(tmpdir(), 'fanlight-uploads')
  mkdirSync(dest, { recursive: true })
  // On disk, never in memory: feeds run to hundreds of megabytes.
  const upload = multer({ dest, limits: { fileSize: limits.maxUploadBytes, files: 1, fields: 5 } })
  const readers = requireRole('planner', 'manager', 'admin')
  const writers = requireRole('planner', 'admin')
  const id = (p: unknown) => (p as { id: number }).id

  const r = Router()
  r.post('/', writers, upload.single('file'), validate({ body: feedUploadBody }), async (req, res) => {
    if (!req.file) throw new Unprocessable('Attach the GTFS zip as the form field "file".', [{ path: ['file'], message: 'Required' }])
    res.status(202).json(await startFeedImport(ctx.db, currentUser(res.locals), req.file, req.body.name, limits))
  })
  r.get('/', readers, async (_req, res) => { res.json(await listFeeds(ctx.db, currentUser(res.locals))) })
  r.get('/:id', readers, validate({ params: feedIdParams }), async (req, res) => {
    res.json(await getFeed(ctx.db, currentUser(res.locals), id(req.params)))
  })
  r.delete('/:id', writers, validate({ params: feedIdParams }), async (req, res) => {
    await deleteFeed(ctx.db, currentUser(res.locals), id(req.params))
    res.status(204).end()
  })
  r.get('/:id/routes', readers, validate({ params: feedIdParams }), async (req, res) => {
    res.json(await feedRoutes(ctx.db, currentUser(res.locals), id(req.params)))
  })
  r.get('/:id/shapes/:shapeId', readers, validate({ params: feedShapeParams }), async (req, res) => {
    const p = req.params as unknown as { id: number; shapeId: string }
    res.json(await feedShape(ctx.db, currentUser(res.locals), p.id, p.shapeId))
  })
  // An upload refused after multer stored it (bad fields) must not stay in the scratch folder.
  const dropUpload: ErrorRequestHandler = (err, req, _res, next) => {
    if (req.file) void rm(req.file.path, { force: true })
    next(err)
  }
  r.use(dropUpload)
  return r
}

import { Router } from 'express'
import type { AppContext } from '../context'
import { validate } from '../middleware/validate'
import { currentUser, requireRole } from '../auth/middleware'
import { inviteUser, listOrganisations, listUsers, patchOrganisation, patchUser } from '../services/users'
import { idParams, inviteBody, organisationPatchBody, userPatchBody } from '../../shared/schemas/auth'

export function usersRouter(ctx: AppContext): Router {
  const r = Router()
  r.use(requireRole('admin'))
  r.get('/', async (_req, res) => { res.json(await listUsers(ctx.db)) })
  r.post('/', validate({ body: inviteBody }), async (req, res) => {
    res.status(201).json(await inviteUser(ctx.db, ctx.mailer, ctx.clock, req.body, ctx.publicUrl(req)))
  })
  r.patch('/:id', validate({ params: idParams, body: userPatchBody }), async (req, res) => {
    res.json(await patchUser(ctx.db, currentUser(res.locals).id, req.params.id as string, req.body))
  })
  return r
}

export function organisationsRouter(ctx: AppContext): Router {
  const r = Router()
  r.get('/', requireRole('planner', 'engineer', 'manager', 'admin'), async (_req, res) => {
    res.json(await listOrganisations(ctx.db))
  })
  r.patch('/:id', requireRole('admin'), validate({ params: idParams, body: organisationPatchBody }), async (req, res) => {
    res.json(await patchOrganisation(ctx.db, req.params.id as string, req.body))
  })
  return r
}

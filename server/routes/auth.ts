import { Router } from 'express'
import { ipKeyGenerator, rateLimit } from 'express-rate-limit'
import { eq } from 'drizzle-orm'
import type { AppContext } from '../context'
import { users } from '../db/schema'
import { Unauthorized } from '../errors'
import { validate } from '../middleware/validate'
import { requireAuth, currentUser } from '../auth/middleware'
import { burnVerify, verifyPassword } from '../auth/password'
import { acceptInvite, getUser } from '../services/users'
import { acceptInviteBody, loginBody } from '../../shared/schemas/auth'

export function authRouter(ctx: AppContext): Router {
  const r = Router()
  const { db, lucia } = ctx
  const loginLimiter = rateLimit({
    windowMs: ctx.loginRateLimit.windowMs,
    limit: ctx.loginRateLimit.limit,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    // Per address and account, so one office behind a NAT does not lock everyone out.
    keyGenerator: (req) => `${ipKeyGenerator(req.ip ?? '')}|${String((req.body as { email?: unknown })?.email ?? '').toLowerCase()}`,
    message: { error: 'rate_limited', message: 'Too many sign-in attempts. Wait a few minutes and try again.' },
  })

  r.post('/login', loginLimiter, validate({ body: loginBody }), async (req, res) => {
    const { email, password } = req.body as { email: string; password: string }
    const [row] = await db.select().from(users).where(eq(users.email, email))
    const ok = row?.passwordHash && row.active ? await verifyPassword(row.passwordHash, password) : (await burnVerify(password), false)
    if (!row || !ok) throw new Unauthorized('E-mail or password is wrong.')
    const session = await lucia.createSession(row.id, {})
    res.append('Set-Cookie', lucia.createSessionCookie(session.id).serialize())
    res.json({ user: await getUser(db, row.id) })
  })

  r.post('/logout', async (_req, res) => {
    if (res.locals.session) await lucia.invalidateSession(res.locals.session.id)
    res.append('Set-Cookie', lucia.createBlankSessionCookie().serialize())
    res.status(204).end()
  })

  r.get('/me', requireAuth, async (_req, res) => {
    res.json({ user: await getUser(db, currentUser(res.locals).id) })
  })

  r.post('/invite/accept', validate({ body: acceptInviteBody }), async (req, res) => {
    const user = await acceptInvite(db, ctx.clock, req.body)
    res.json({ user })
  })
  return r
}

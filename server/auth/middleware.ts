import type { RequestHandler } from 'express'
import type { Session, User } from 'lucia'
import type { AppLucia } from './lucia'
import { Forbidden, Unauthorized } from '../errors'
import type { Role } from '../../shared/roles'

declare module 'express-serve-static-core' {
  interface Locals {
    user?: User
    session?: Session
  }
}

/** Reads the session cookie on every request; refreshes it when lucia extends the session. */
export function loadSession(lucia: AppLucia): RequestHandler {
  return async (req, res, next) => {
    const id = lucia.readSessionCookie(req.headers.cookie ?? '')
    if (!id) return next()
    const { session, user } = await lucia.validateSession(id)
    if (!session) {
      res.append('Set-Cookie', lucia.createBlankSessionCookie().serialize())
      return next()
    }
    if (!user.active) {
      // A deactivated user's sessions end at once.
      await lucia.invalidateUserSessions(user.id)
      res.append('Set-Cookie', lucia.createBlankSessionCookie().serialize())
      return next()
    }
    if (session.fresh) res.append('Set-Cookie', lucia.createSessionCookie(session.id).serialize())
    res.locals.user = user
    res.locals.session = session
    next()
  }
}

export const requireAuth: RequestHandler = (_req, res, next) => {
  if (!res.locals.user) return next(new Unauthorized())
  next()
}

/** Declares at the route which roles may call it; services re-check data-dependent rules. */
export function requireRole(...roles: Role[]): RequestHandler {
  return (_req, res, next) => {
    const user = res.locals.user
    if (!user) return next(new Unauthorized())
    if (!roles.includes(user.role)) return next(new Forbidden())
    next()
  }
}

/** The signed-in user; only valid behind requireAuth or requireRole. */
export function currentUser(locals: { user?: User }): User {
  if (!locals.user) throw new Unauthorized()
  return locals.user
}

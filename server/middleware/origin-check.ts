import type { RequestHandler } from 'express'
import { verifyRequestOrigin } from 'lucia'
import { Forbidden } from '../errors'

const SAFE = new Set(['GET', 'HEAD', 'OPTIONS'])

/**
 * Refuses state-changing requests whose Origin is another site (CSRF defence on top of SameSite=Lax).
 * Requests without an Origin header (curl, server-to-server) carry no browser cookie risk and pass.
 */
export const originCheck: RequestHandler = (req, _res, next) => {
  if (SAFE.has(req.method)) return next()
  const origin = req.get('origin')
  const host = req.get('x-forwarded-host') ?? req.get('host')
  if (origin && (!host || !verifyRequestOrigin(origin, [host]))) {
    return next(new Forbidden('Request origin does not match this site.'))
  }
  next()
}

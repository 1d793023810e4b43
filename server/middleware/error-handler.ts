import type { ErrorRequestHandler } from 'express'
import { ZodError } from 'zod'
import { HttpError } from '../errors'

interface BodyParserError { type?: string; status?: number }

/** The one place where errors become JSON responses. No stack reaches the client. */
export const errorHandler: ErrorRequestHandler = (err, _req, res, _next) => {
  if (err instanceof ZodError) {
    res.status(422).json({
      error: 'invalid',
      message: 'The request has invalid or unknown fields.',
      issues: err.issues.map((i) => ({ path: i.path, message: i.message, code: i.code })),
    })
    return
  }
  if (err instanceof HttpError) {
    res.status(err.status).json({ error: err.code, message: err.message, ...(err.details ? (err.details as object) : {}) })
    return
  }
  const bp = err as BodyParserError
  if (bp.type === 'entity.parse.failed') {
    res.status(400).json({ error: 'malformed_json', message: 'The request body is not valid JSON.' })
    return
  }
  if (bp.type === 'entity.too.large') {
    res.status(413).json({ error: 'too_large', message: 'The request body is too large.' })
    return
  }
  if ((err as { name?: string }).name === 'MulterError') {
    const code = (err as { code?: string }).code
    res.status(code === 'LIMIT_FILE_SIZE' ? 413 : 400).json({ error: 'upload', message: (err as Error).message })
    return
  }
  if (typeof bp.status === 'number' && bp.status >= 400 && bp.status < 500) {
    res.status(bp.status).json({ error: 'bad_request', message: (err as Error).message })
    return
  }
  console.error(err)
  res.status(500).json({ error: 'internal', message: 'Something went wrong on the server.' })
}

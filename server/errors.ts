// HTTP errors thrown by services and middleware; the error handler turns them into JSON.
export class HttpError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly details?: unknown,
  ) {
    super(message)
  }
}

export class BadRequest extends HttpError {
  constructor(message: string, details?: unknown) { super(400, 'bad_request', message, details) }
}
export class Unauthorized extends HttpError {
  constructor(message = 'Sign in first.') { super(401, 'unauthorized', message) }
}
export class Forbidden extends HttpError {
  constructor(message = 'Your role may not do this.') { super(403, 'forbidden', message) }
}
export class NotFound extends HttpError {
  constructor(what = 'Resource') { super(404, 'not_found', `${what} not found.`) }
}
export class Conflict extends HttpError {
  constructor(message: string, details?: unknown) { super(409, 'conflict', message, details) }
}
/** A request that parses but breaks a rule of the domain (a safety minimum, say). */
export class Unprocessable extends HttpError {
  constructor(message: string, issues: { path: (string | number)[]; message: string }[]) {
    super(422, 'invalid', message, { issues })
  }
}

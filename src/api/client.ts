// The one fetch wrapper of the client: JSON in and out, the session cookie, typed errors.

export interface ApiIssue {
  path: (string | number)[]
  message: string
}

export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly issues: ApiIssue[] = [],
    readonly body: unknown = null,
  ) {
    super(message)
  }
}

type Method = 'GET' | 'POST' | 'PATCH' | 'PUT' | 'DELETE'

export async function api<T>(method: Method, path: string, body?: unknown): Promise<T> {
  const isForm = typeof FormData !== 'undefined' && body instanceof FormData
  const res = await fetch(`/api${path}`, {
    method,
    credentials: 'same-origin',
    headers: body === undefined || isForm ? { accept: 'application/json' } : { 'content-type': 'application/json', accept: 'application/json' },
    body: body === undefined ? undefined : isForm ? body : JSON.stringify(body),
  })
  if (res.status === 204) return undefined as T
  const text = await res.text()
  const data: unknown = text ? safeJson(text) : null
  if (!res.ok) {
    const d = (data ?? {}) as { error?: string; message?: string; issues?: ApiIssue[] }
    throw new ApiError(res.status, d.error ?? 'error', d.message ?? `Request failed (${res.status}).`, d.issues ?? [], data)
  }
  return data as T
}

function safeJson(text: string): unknown {
  try { return JSON.parse(text) } catch { return { message: text } }
}

/** The text to show a person for any error thrown by api(). */
export function errorText(err: unknown): string {
  if (err instanceof ApiError) {
    const detail = err.issues.map((i) => `${i.path.join('.') || 'request'}: ${i.message}`).join('; ')
    return detail ? `${err.message} ${detail}` : err.message
  }
  return err instanceof Error ? err.message : String(err)
}

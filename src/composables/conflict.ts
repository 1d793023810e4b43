import { ApiError } from '@/api/client'

/** The row the server holds now, when a write was refused because someone saved first (409). */
export function conflictCurrent<T>(err: unknown): T | null {
  if (!(err instanceof ApiError) || err.status !== 409) return null
  return ((err.body as { current?: T } | null)?.current) ?? null
}

/** "cycle 100 -> 90; yellow 4 -> 3.5": what another person changed, field by field. */
export function describeChanges<T extends object>(mine: Partial<T>, theirs: T, labels: Partial<Record<keyof T, string>>): string {
  const parts: string[] = []
  for (const key of Object.keys(labels) as (keyof T)[]) {
    const a = mine[key], b = theirs[key]
    if (a !== undefined && JSON.stringify(a) !== JSON.stringify(b)) parts.push(`${labels[key]} ${String(a)} → ${String(b)}`)
  }
  return parts.join('; ')
}

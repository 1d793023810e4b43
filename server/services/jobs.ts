import { randomUUID } from 'node:crypto'
import { and, eq, inArray } from 'drizzle-orm'
import type { Db } from '../db'
import { jobs } from '../db/schema'
import { NotFound } from '../errors'
import type { JobDto } from '../../shared/schemas/jobs'

export interface JobProgress {
  progress?: number
  stage?: string
  message?: string
}
export type ReportProgress = (p: JobProgress) => Promise<void>

export async function createJob(db: Db, kind: string, createdBy: string | null): Promise<string> {
  const id = randomUUID()
  await db.insert(jobs).values({ id, kind, createdBy })
  return id
}

export async function getJob(db: Db, id: string): Promise<JobDto> {
  const [row] = await db.select().from(jobs).where(eq(jobs.id, id))
  if (!row) throw new NotFound('Job')
  return { id: row.id, kind: row.kind, state: row.state, progress: row.progress, stage: row.stage, message: row.message, result: row.result }
}

export async function activeJobs(db: Db, kind: string) {
  return db.select({ id: jobs.id }).from(jobs).where(and(eq(jobs.kind, kind), inArray(jobs.state, ['queued', 'running'])))
}

/**
 * Runs work in the background of this process and records its progress in the jobs table.
 * Progress writes are throttled: the client polls, it does not need every step.
 */
export function runJob<T>(db: Db, id: string, work: (report: ReportProgress) => Promise<T>): Promise<void> {
  let last = 0
  const report: ReportProgress = async (p) => {
    const now = Date.now()
    if (now - last < 200 && p.progress !== 1) return
    last = now
    await db.update(jobs).set({ ...p, state: 'running', updatedAt: new Date() }).where(eq(jobs.id, id))
  }
  return (async () => {
    await db.update(jobs).set({ state: 'running', stage: 'starting', updatedAt: new Date() }).where(eq(jobs.id, id))
    try {
      const result = await work(report)
      await db.update(jobs)
        .set({ state: 'succeeded', progress: 1, stage: 'done', result: result ?? null, updatedAt: new Date() })
        .where(eq(jobs.id, id))
    } catch (err) {
      const message = err instanceof Error ? err.message : String(err)
      const result = (err as { result?: unknown }).result ?? null
      await db.update(jobs).set({ state: 'failed', stage: 'failed', message, result, updatedAt: new Date() }).where(eq(jobs.id, id))
    }
  })()
}

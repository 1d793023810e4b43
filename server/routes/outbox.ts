import { Router } from 'express'
import { desc } from 'drizzle-orm'
import type { AppContext } from '../context'
import { requireRole } from '../auth/middleware'
import { outboxMessages } from '../db/schema'

export function outboxRouter(ctx: AppContext): Router {
  const r = Router()
  r.get('/', requireRole('admin'), async (_req, res) => {
    const rows = await ctx.db.select().from(outboxMessages).orderBy(desc(outboxMessages.createdAt), desc(outboxMessages.id)).limit(500)
    res.json(rows.map((m) => ({ id: m.id, to: m.to, subject: m.subject, text: m.text, createdAt: m.createdAt.toISOString() })))
  })
  return r
}

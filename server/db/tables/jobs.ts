import { index, jsonb, pgTable, real, text, timestamp } from 'drizzle-orm/pg-core'
import { users } from './auth'

// Long-running work (feed imports, evaluations) reported to the client by polling.
export const jobs = pgTable('jobs', {
  id: text('id').primaryKey(),
  kind: text('kind').notNull(),
  state: text('state', { enum: ['queued', 'running', 'succeeded', 'failed'] }).notNull().default('queued'),
  progress: real('progress').notNull().default(0),
  stage: text('stage').notNull().default('queued'),
  message: text('message').notNull().default(''),
  result: jsonb('result'),
  createdBy: text('created_by').references(() => users.id),
  createdAt: timestamp('created_at', { withTimezone: true, mode: 'date' }).notNull().defaultNow(),
  updatedAt: timestamp('updated_at', { withTimezone: true, mode: 'date' }).notNull().defaultNow(),
}, (t) => [index('jobs_kind_state_idx').on(t.kind, t.state)])

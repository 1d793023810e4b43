import { pgTable, serial, text, timestamp } from 'drizzle-orm/pg-core'

// Messages received by the local fake SMTP server (development and tests only).
export const outboxMessages = pgTable('outbox_messages', {
  id: serial('id').primaryKey(),
  to: text('to').notNull(),
  from: text('from').notNull(),
  subject: text('subject').notNull(),
  text: text('text').notNull(),
  createdAt: timestamp('created_at', { withTimezone: true, mode: 'date' }).notNull().defaultNow(),
})

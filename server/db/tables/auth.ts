import { boolean, index, pgTable, text, timestamp } from 'drizzle-orm/pg-core'

// Organisations are the agency and the cities (jurisdictions) that own the signals.
export const organisations = pgTable('organisations', {
  id: text('id').primaryKey(),
  name: text('name').notNull(),
  kind: text('kind', { enum: ['agency', 'city'] }).notNull(),
  unitSystem: text('unit_system', { enum: ['metric', 'us'] }).notNull().default('metric'),
  createdAt: timestamp('created_at', { withTimezone: true, mode: 'date' }).notNull().defaultNow(),
})

export const users = pgTable('users', {
  id: text('id').primaryKey(),
  email: text('email').notNull().unique(),
  name: text('name').notNull(),
  role: text('role', { enum: ['planner', 'engineer', 'manager', 'admin'] }).notNull(),
  organisationId: text('organisation_id').notNull().references(() => organisations.id),
  // Null until the invited user sets a password through the invite link.
  passwordHash: text('password_hash'),
  active: boolean('active').notNull().default(true),
  createdAt: timestamp('created_at', { withTimezone: true, mode: 'date' }).notNull().defaultNow(),
}, (t) => [index('users_organisation_idx').on(t.organisationId)])

// Shape required by lucia's Drizzle adapter.
export const sessions = pgTable('sessions', {
  id: text('id').primaryKey(),
  userId: text('user_id').notNull().references(() => users.id, { onDelete: 'cascade' }),
  expiresAt: timestamp('expires_at', { withTimezone: true, mode: 'date' }).notNull(),
})

export const invites = pgTable('invites', {
  // SHA-256 of the token sent by e-mail; the token itself is never stored.
  tokenHash: text('token_hash').primaryKey(),
  userId: text('user_id').notNull().references(() => users.id, { onDelete: 'cascade' }),
  expiresAt: timestamp('expires_at', { withTimezone: true, mode: 'date' }).notNull(),
  usedAt: timestamp('used_at', { withTimezone: true, mode: 'date' }),
})

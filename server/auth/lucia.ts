import { Lucia } from 'lucia'
import { DrizzlePostgreSQLAdapter } from '@lucia-auth/adapter-drizzle'
import type { Db } from '../db'
import { sessions, users } from '../db/schema'
import type { Role } from '../../shared/roles'

export function createLucia(db: Db, secureCookie: boolean) {
  const adapter = new DrizzlePostgreSQLAdapter(db, sessions, users)
  return new Lucia(adapter, {
    sessionCookie: { name: 'fanlight_session', attributes: { secure: secureCookie, sameSite: 'lax' } },
    // Drizzle returns camelCase columns, so the attributes are the schema's field names.
    getUserAttributes: (a) => ({
      email: a.email,
      name: a.name,
      role: a.role,
      organisationId: a.organisationId,
      active: a.active,
    }),
  })
}

export type AppLucia = ReturnType<typeof createLucia>

interface DatabaseUserAttributes {
  email: string
  name: string
  role: Role
  organisationId: string
  active: boolean
}

declare module 'lucia' {
  interface Register {
    Lucia: AppLucia
    DatabaseUserAttributes: DatabaseUserAttributes
  }
}

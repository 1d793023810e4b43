import { mkdirSync } from 'node:fs'
import { fileURLToPath } from 'node:url'
import { PGlite } from '@electric-sql/pglite'
import { drizzle } from 'drizzle-orm/pglite'
import { migrate } from 'drizzle-orm/pglite/migrator'
import * as schema from './schema'

export type Db = ReturnType<typeof drizzle<typeof schema>>
export type Tx = Parameters<Parameters<Db['transaction']>[0]>[0]

export interface Database {
  db: Db
  client: PGlite
  close(): Promise<void>
}

const migrationsFolder = fileURLToPath(new URL('../../drizzle', import.meta.url))

/**
 * Opens PGlite on a data directory (created if missing) or in memory when dataDir is 'memory',
 * and applies the drizzle-kit migrations (a no-op for those already applied).
 */
export async function openDatabase(dataDir: string, options: { loadDataDir?: Blob } = {}): Promise<Database> {
  if (dataDir !== 'memory') mkdirSync(dataDir, { recursive: true })
  // loadDataDir starts from a dump (dumpDataDir) instead of an empty cluster: tests use it to skip seeding.
  const client = dataDir === 'memory' ? new PGlite({ loadDataDir: options.loadDataDir }) : new PGlite(dataDir, { loadDataDir: options.loadDataDir })
  await client.waitReady
  const db = drizzle({ client, schema })
  await migrate(db, { migrationsFolder })
  return { db, client, close: () => client.close() }
}

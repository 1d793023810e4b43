import { readFileSync, writeFileSync, mkdtempSync } from 'node:fs'
import { tmpdir } from 'node:os'
import path from 'node:path'
import { openDatabase } from '../../server/db'
import { seedDemo } from '../../server/seed/demo'

export const DEMO_PASSWORD = 'fanlight-demo'
export const SNAPSHOT_ENV = 'FANLIGHT_TEST_SEED_SNAPSHOT'

/** Migrates and seeds the whole demo scenario once and dumps the data directory to a file. */
export async function writeSeedSnapshot(): Promise<string> {
  const database = await openDatabase('memory')
  await seedDemo(database.db, { password: DEMO_PASSWORD })
  const blob = await database.client.dumpDataDir('none')
  await database.close()
  const file = path.join(mkdtempSync(path.join(tmpdir(), 'fanlight-seed-')), 'seeded.tar')
  writeFileSync(file, Buffer.from(await blob.arrayBuffer()))
  return file
}

let cached: Blob | undefined
/**
 * The seeded database as a blob: from the file written by the global setup when there is one,
 * else built here (a test file run on its own).
 */
export async function seedSnapshot(): Promise<Blob> {
  if (cached) return cached
  const file = process.env[SNAPSHOT_ENV] ?? (process.env[SNAPSHOT_ENV] = await writeSeedSnapshot())
  cached = new Blob([readFileSync(file)])
  return cached
}

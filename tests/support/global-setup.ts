import { rmSync } from 'node:fs'
import path from 'node:path'
import { SNAPSHOT_ENV, writeSeedSnapshot } from './seed-snapshot'

// Seeding the demo scenario costs seconds; do it once per run and let every API test file load the dump.
export default async function setup() {
  const file = await writeSeedSnapshot()
  process.env[SNAPSHOT_ENV] = file
  return () => rmSync(path.dirname(file), { recursive: true, force: true })
}

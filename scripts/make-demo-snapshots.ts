// Writes the demo's archived GTFS-realtime snapshots: sample-feeds/realtime/before.zip and
// after.zip, a FeedMessage every 60 s (VehiclePositions and TripUpdates of the eastbound runs of
// routes 7 and 17, the demo corridor's) on three weekday mornings (Tuesday to Thursday, 06:45-09:15
// local) before priority went live on Kestrel Avenue (1 October 2026) and three after. Deterministic: the same
// bytes on every run. Usage: node --import tsx scripts/make-demo-snapshots.ts
import { mkdirSync, writeFileSync } from 'node:fs'
import { fileURLToPath } from 'node:url'
import path from 'node:path'
import { zipSync } from 'fflate'
import { loadDemoScenario } from '../server/services/realtime/demo-scenario'
import { serviceDayStart } from '../server/services/realtime/service-day'

const out = fileURLToPath(new URL('../sample-feeds/realtime/', import.meta.url))
const TIME_ZONE = 'Etc/GMT-1' // the demo agency's
const STEP_S = 60
const FROM_S = 6.75 * 3600
const TO_S = 9.25 * 3600
const PERIODS = {
  before: { priority: false, dates: ['20260915', '20260916', '20260917'] },
  after: { priority: true, dates: ['20261013', '20261014', '20261015'] },
}
const MAX_BYTES = 500 * 1024

mkdirSync(out, { recursive: true })
let total = 0
for (const [name, p] of Object.entries(PERIODS)) {
  const scenario = loadDemoScenario({ priority: p.priority, directionId: 0 })
  const files: Record<string, [Uint8Array, { mtime: Date }]> = {}
  let vehicles = 0
  for (const date of p.dates) {
    const start = serviceDayStart(date, TIME_ZONE)
    for (let t = start + FROM_S; t < start + TO_S; t += STEP_S) {
      // Short names (month, day, UTC time) keep the zip's per-file overhead small.
      const stamp = new Date(t * 1000).toISOString().slice(5, 19).replace(/[-:]/g, '')
      const data = scenario.feedAt(t)
      vehicles += scenario.vehiclesAt(t).length
      files[`${stamp}.pb`] = [data, { mtime: new Date('2026-10-01T00:00:00Z') }]
    }
  }
  const zip = zipSync(files, { level: 9, mtime: new Date('2026-10-01T00:00:00Z') })
  writeFileSync(path.join(out, `${name}.zip`), zip)
  total += zip.length
  console.log(`${name}.zip: ${Object.keys(files).length} snapshots, ${vehicles} vehicle positions, ${(zip.length / 1024).toFixed(0)} KB`)
}
if (total > MAX_BYTES) throw new Error(`the demo snapshots take ${total} bytes, more than ${MAX_BYTES}`)

import { openDatabase } from './db'
import { createApp } from './app'
import { createSmtpMailer } from './services/mail'
import { startFakeSmtp } from './services/fake-smtp'
import { seedDemo } from './seed/demo'
import { systemClock } from './clock'
import { startRealtime } from './services/realtime/start'

// Only configuration and listening live here; everything else is built by createApp.
const production = process.env.NODE_ENV === 'production'
const port = Number(process.env.PORT ?? 3000)
const dataDir = process.env.DATA_DIR ?? './data/pglite'
const seed = process.env.SEED_DEMO ? process.env.SEED_DEMO === '1' : !production

const database = await openDatabase(dataDir)
const fakeSmtp = process.env.SMTP_URL ? null : await startFakeSmtp(database.db)
const mailer = createSmtpMailer(process.env.SMTP_URL ?? fakeSmtp!.url)
if (seed) await seedDemo(database.db, { password: process.env.DEMO_PASSWORD ?? 'fanlight-demo' })

const app = createApp({ db: database.db, mailer, secureCookies: production, publicUrl: process.env.PUBLIC_URL })
// Polls the agencies' realtime feeds; outside production also serves the demo buses locally (REALTIME_FAKE=0: not).
const realtime = await startRealtime(database.db, systemClock, { fakeFeed: !production && process.env.REALTIME_FAKE !== '0' })
if (realtime.fakeFeedUrl) console.log(`Local demo realtime feed: ${realtime.fakeFeedUrl}`)
const server = app.listen(port, () => {
  console.log(`Fanlight listening on http://localhost:${port} (data: ${dataDir}${fakeSmtp ? ', mail: local outbox' : ''})`)
})

async function shutdown() {
  server.close()
  await realtime.stop()
  mailer.close()
  await fakeSmtp?.close()
  await database.close()
  process.exit(0)
}
process.on('SIGINT', shutdown)
process.on('SIGTERM', shutdown)

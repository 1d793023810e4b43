// What the server process starts for realtime: the poller of the agencies' feeds and, in
// development, the local fake endpoint serving the demo buses (priority live on Kestrel Avenue),
// whose URL the Observed page offers as a source. Called by server/index.ts only.
import type { Db } from '../../db'
import type { Clock } from '../../clock'
import { startRealtimePoller } from './poller'
import { startFakeRealtimeFeed } from './fake-feed'
import { loadDemoScenario } from './demo-scenario'
import { setDemoFeedUrl } from './demo-feed'

export async function startRealtime(db: Db, clock: Clock, opts: { fakeFeed: boolean }): Promise<{ fakeFeedUrl: string | null; stop(): Promise<void> }> {
  let fake: Awaited<ReturnType<typeof startFakeRealtimeFeed>> | null = null
  if (opts.fakeFeed) {
    const scenario = loadDemoScenario({ priority: true, tripUpdateEveryS: 0 })
    fake = await startFakeRealtimeFeed((t) => scenario.feedAt(t), clock)
    setDemoFeedUrl(fake.url)
  }
  const poller = startRealtimePoller(db, clock)
  return {
    fakeFeedUrl: fake?.url ?? null,
    async stop() {
      await poller.stop()
      await fake?.close()
      setDemoFeedUrl(null)
    },
  }
}

// Polls every active realtime source at its own interval. Started by server/index.ts (or a test)
// and stopped on shutdown; importing this module starts nothing. Due times are kept in wall-clock
// milliseconds of this process, while snapshots are checked against the app's clock.
import { eq } from 'drizzle-orm'
import type { Db } from '../../db'
import type { Clock } from '../../clock'
import { realtimeSources } from '../../db/schema'
import { pollSource } from './sources'

export interface RealtimePoller {
  stop(): Promise<void>
  /** Resolves once every source that is due has been polled (used by tests). */
  tick(): Promise<void>
}

export function startRealtimePoller(db: Db, clock: Clock, opts: { tickMs?: number } = {}): RealtimePoller {
  const lastPoll = new Map<string, number>()
  const running = new Set<string>()
  let current: Promise<void> = Promise.resolve()
  let stopped = false

  async function tick() {
    const sources = await db.select().from(realtimeSources).where(eq(realtimeSources.active, true))
    const now = Date.now()
    const due = sources.filter((s) => !running.has(s.id) && now - (lastPoll.get(s.id) ?? -Infinity) >= s.intervalS * 1000)
    await Promise.all(due.map(async (s) => {
      running.add(s.id)
      lastPoll.set(s.id, now)
      try {
        await pollSource(db, clock, s)
      } catch (err) {
        console.error(`realtime: polling source ${s.id} failed`, err)
      } finally {
        running.delete(s.id)
      }
    }))
  }

  const timer = setInterval(() => {
    if (stopped) return
    current = current.then(tick).catch((err) => console.error('realtime: poller tick failed', err))
  }, opts.tickMs ?? 1000)
  timer.unref()

  return {
    async stop() {
      stopped = true
      clearInterval(timer)
      await current
    },
    tick() {
      current = current.then(tick)
      return current
    },
  }
}

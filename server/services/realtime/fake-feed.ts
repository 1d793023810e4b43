// A local stand-in for an agency's GTFS-realtime endpoint: an HTTP server on 127.0.0.1 (a free
// port) that answers every GET with the scenario's FeedMessage for the clock's current time, or
// for ?t=<unix seconds>. Started by the server in development and by tests; never on import.
import { createServer } from 'node:http'
import type { AddressInfo } from 'node:net'
import type { Clock } from '../../clock'

export interface FakeRealtimeFeed {
  url: string
  /** How many feeds it has served. */
  served(): number
  close(): Promise<void>
}

export function startFakeRealtimeFeed(feedAt: (timeS: number) => Uint8Array, clock: Clock): Promise<FakeRealtimeFeed> {
  let count = 0
  const server = createServer((req, res) => {
    if (req.method !== 'GET') { res.writeHead(405).end(); return }
    const t = new URL(req.url ?? '/', 'http://127.0.0.1').searchParams.get('t')
    const timeS = t !== null && /^\d+$/.test(t) ? Number(t) : Math.floor(clock.now().getTime() / 1000)
    try {
      const body = feedAt(timeS)
      count++
      res.writeHead(200, { 'content-type': 'application/x-protobuf', 'content-length': body.length, 'cache-control': 'no-store' })
      res.end(body)
    } catch (err) {
      res.writeHead(500, { 'content-type': 'text/plain' }).end(err instanceof Error ? err.message : String(err))
    }
  })
  return new Promise((resolve, reject) => {
    server.once('error', reject)
    server.listen(0, '127.0.0.1', () => {
      const { port } = server.address() as AddressInfo
      resolve({
        url: `http://127.0.0.1:${port}/gtfs-rt/vehicle-positions`,
        served: () => count,
        close: () => new Promise<void>((done) => { server.closeAllConnections(); server.close(() => done()) }),
      })
    })
  })
}

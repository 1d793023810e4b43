import { afterAll, describe, expect, it } from 'vitest'
import { startServerProcess, type ServerProcess } from '../support/server-process'

let server: ServerProcess | undefined
afterAll(async () => { await server?.stop() })

async function login(url: string, email: string, password = 'fanlight-demo') {
  const res = await fetch(`${url}/api/auth/login`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email, password }) })
  expect(res.status).toBe(200)
  return res.headers.get('set-cookie')!.split(';')[0]
}

describe('the on-disk database', () => {
  it('keeps data written before a restart (same DATA_DIR), and seeds the demo only once', async () => {
    server = await startServerProcess()
    const dataDir = server.dataDir
    let cookie = await login(server.url, 'admin@fanlight.test')
    const created = await fetch(`${server.url}/api/users`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', cookie },
      body: JSON.stringify({ email: 'kept@fanlight.test', name: 'Kept Across Restarts', role: 'manager', organisationId: 'org-lindenmere' }),
    })
    expect(created.status).toBe(201)
    await server.stop()

    server = await startServerProcess({ dataDir })
    cookie = await login(server.url, 'admin@fanlight.test')
    const list = await (await fetch(`${server.url}/api/users`, { headers: { cookie } })).json() as { email: string }[]
    expect(list.map((u) => u.email)).toContain('kept@fanlight.test')
    expect(list.filter((u) => u.email === 'planner@fanlight.test')).toHaveLength(1)
  })
})

import { spawn, type ChildProcess } from 'node:child_process'
import { createServer } from 'node:net'
import { mkdtempSync } from 'node:fs'
import { tmpdir } from 'node:os'
import path from 'node:path'

export interface ServerProcess {
  url: string
  dataDir: string
  stop(): Promise<void>
}

export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = createServer()
    s.listen(0, '127.0.0.1', () => {
      const port = (s.address() as { port: number }).port
      s.close(() => resolve(port))
    })
    s.on('error', reject)
  })
}

export const newDataDir = () => path.join(mkdtempSync(path.join(tmpdir(), 'fanlight-test-')), 'pglite')

/**
 * Starts the real server (`server/index.ts`, as `npm start` does after the build) on a free port
 * and waits until /api/health answers.
 */
export async function startServerProcess(opts: { dataDir?: string; env?: Record<string, string> } = {}): Promise<ServerProcess> {
  const port = await freePort()
  const dataDir = opts.dataDir ?? newDataDir()
  const child: ChildProcess = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], {
    env: { ...process.env, PORT: String(port), DATA_DIR: dataDir, NODE_ENV: 'test', ...opts.env },
    stdio: ['ignore', 'pipe', 'pipe'],
  })
  let output = ''
  child.stdout?.on('data', (d) => { output += String(d) })
  child.stderr?.on('data', (d) => { output += String(d) })
  const url = `http://127.0.0.1:${port}`
  const deadline = Date.now() + 150_000
  for (;;) {
    if (child.exitCode !== null) throw new Error(`server exited early (${child.exitCode}):\n${output}`)
    try {
      const res = await fetch(`${url}/api/health`)
      if (res.ok) break
    } catch { /* not listening yet */ }
    if (Date.now() > deadline) { child.kill('SIGKILL'); throw new Error(`server did not start:\n${output}`) }
    await new Promise((r) => setTimeout(r, 250))
  }
  return {
    url,
    dataDir,
    stop: () => new Promise<void>((resolve) => {
      if (child.exitCode !== null) return resolve()
      child.once('exit', () => resolve())
      child.kill('SIGTERM')
      setTimeout(() => child.kill('SIGKILL'), 15_000).unref()
    }),
  }
}

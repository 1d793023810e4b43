import { afterAll } from 'vitest'
import type { BrowserContext, Page } from 'playwright-core'
import { startServerProcess, type ServerProcess } from '../../support/server-process'
import { launchBrowser } from './browser'

export interface BrowserSession {
  server: ServerProcess
  browser: BrowserContext
  page: Page
}

/**
 * The real server on a fresh data directory and a chromium page, for one test file:
 * `const { server, page } = await openBrowserSession()` at the top of the file. Both close after its tests.
 */
export async function openBrowserSession(): Promise<BrowserSession> {
  const server = await startServerProcess()
  const browser = await launchBrowser()
  afterAll(async () => {
    await browser.close()
    await server.stop()
  })
  return { server, browser, page: await browser.newPage() }
}

import { mkdirSync, mkdtempSync } from 'node:fs'
import { tmpdir } from 'node:os'
import path from 'node:path'
import { chromium, type BrowserContext, type Page } from 'playwright-core'

export const SCREENSHOT_DIR = path.resolve('test-artifacts/screenshots')

/** Debian's chromium, headless, with no GPU and no background network. */
export async function launchBrowser(): Promise<BrowserContext> {
  mkdirSync(SCREENSHOT_DIR, { recursive: true })
  return chromium.launchPersistentContext(mkdtempSync(path.join(tmpdir(), 'fanlight-chromium-')), {
    executablePath: '/usr/bin/chromium',
    headless: true,
    viewport: { width: 1360, height: 860 },
    args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking',
      '--disable-component-update', '--disable-sync'],
  })
}

export async function screenshot(page: Page, name: string): Promise<void> {
  await page.screenshot({ path: path.join(SCREENSHOT_DIR, `${name}.png`), fullPage: true })
}

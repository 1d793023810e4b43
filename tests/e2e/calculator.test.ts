import { describe, expect, it } from 'vitest'
import { screenshot } from './support/browser'
import { AppShell, signInAs } from './support/pages'
import { openBrowserSession } from './support/session'

// The approach calculator in a real browser: its defaults are the pretimed-signal worked example,
// and the browser recomputes the figures as the form changes.
const { server, page } = await openBrowserSession()

/** The numbers of the "Longest queue" figure: metres and vehicles. */
async function longestQueue(): Promise<[number, number]> {
  const tile = page.locator('*', { hasText: /^Longest queue$/ }).last().locator('xpath=..')
  const text = await tile.innerText()
  const m = /([\d.]+)\s*m\s*·\s*([\d.]+)\s*veh/.exec(text)
  if (!m) throw new Error(`no queue figure in: ${text}`)
  return [Number(m[1]), Number(m[2])]
}

async function setNumber(label: string, value: number) {
  const input = page.getByLabel(label, { exact: true })
  await input.click()
  await input.press('Control+A')
  await input.pressSequentially(String(value))
  await input.press('Tab')
}

describe('the approach calculator', () => {
  it('opens on the worked example and follows a longer red at once', async () => {
    await signInAs(page, server.url, 'engineer@fanlight.test')
    await new AppShell(page).go('Calculator')
    await page.getByRole('heading', { name: 'Approach calculator' }).waitFor()
    await page.getByRole('note', { name: 'Safety caution' }).first().waitFor()

    // Stephanopoulos & Michalopoulos 1979 (TR-A 13:295-307), as in REFERENCES.md: q_a = 600 veh/h,
    // red 30 s, v_f = 60, w = 20 km/h, k_j = 120 veh/km -> maximum queue 62.5 m, 7.5 vehicles.
    const [m0, veh0] = await longestQueue()
    expect(m0).toBeCloseTo(62.5, -0.5)
    expect(veh0).toBeCloseTo(7.5, 1)

    // Cycle 80 s with the same 30 s green: red 50 s, still undersaturated (X = 600 / 675 = 0.89).
    // With the same shock and wave speeds the queue grows in proportion to the red: 62.5 x 50/30 =
    // 104.2 m and 7.5 x 50/30 = 12.5 vehicles.
    await setNumber('Cycle', 80)
    await expect.poll(async () => (await longestQueue())[1], { timeout: 10_000 }).toBeCloseTo(12.5, 1)
    expect((await longestQueue())[0]).toBeCloseTo(104.2, -0.5)
    await screenshot(page, 'calculator-engineer')
  })
})

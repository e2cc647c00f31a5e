import type { Page } from 'playwright-core'
import { describe, expect, inject, it } from 'vitest'
import { url, waitForHydration } from '@nuxt/test-utils/e2e'
import { Client } from '../support/client'
import { diaryEntry } from '../support/diary'
import { setupBrowser, signInAs } from '../support/browser'

await setupBrowser()

// Browser tests share one server: this demo patient (LPU-1003) is used by this file only.
const PATIENT = 'luis@demo.tidewell.test'

/** Every script the page fetches from now on, with its text (to tell the charting code apart). */
function scriptsOf(page: Page) {
  const scripts: { url: string, text: Promise<string> }[] = []
  page.on('response', (response) => {
    if (response.request().resourceType() === 'script' || /\.js$/.test(new URL(response.url()).pathname)) {
      scripts.push({ url: response.url(), text: response.text().catch(() => '') })
    }
  })
  return async () => Promise.all(scripts.map(async s => ({ url: s.url, text: await s.text })))
}

// Chart.js reads this option; it and the chart component's own options appear only in the
// chunks that draw a chart, so a script holding it is charting code.
const drawsCharts = (text: string) => text.includes('maintainAspectRatio')

async function open(page: Page, path: string) {
  await page.goto(url(path))
  await waitForHydration(page, url(path), 'hydration')
  await page.waitForLoadState('networkidle')
}

describe('a lean client', () => {
  it('Today and the diary form load no charting code; the diary history loads it and draws both lines', async () => {
    // Two entries, so the history has points to draw.
    const api = await Client.signIn(inject('appUrl'), PATIENT)
    const session = await api.get('/api/_auth/session')
    const patientId = session.body.user.patientId as number
    for (const entry of [diaryEntry(), diaryEntry({ hotFlushes: { perDay: 2, worstSeverity: 'mild', interference: 'none' } })]) {
      expect((await api.post(`/api/patients/${patientId}/diary`, entry)).status).toBe(201)
    }

    const page = await signInAs(PATIENT)
    // Each page opens in a context of its own (an empty cache, the same session): a first load.
    const signedIn = await page.context().storageState()
    const freshPage = async () => (await page.context().browser()!.newContext({ storageState: signedIn })).newPage()
    for (const path of ['/today', '/diary/new']) {
      const fresh = await freshPage()
      const scripts = scriptsOf(fresh)
      await open(fresh, path)
      const loaded = await scripts()
      expect(loaded.length, `${path} loads its scripts`).toBeGreaterThan(0)
      expect(loaded.filter(s => drawsCharts(s.text)).map(s => s.url), `${path} loads no charting code`).toEqual([])
      await fresh.context().close()
    }

    const history = await freshPage()
    const scripts = scriptsOf(history)
    await open(history, '/diary')
    // Both charts draw into a canvas once the charting chunk has arrived.
    await expect.poll(() => history.locator('section[aria-labelledby="diary-chart-hot-flushes-title"] canvas, section[aria-labelledby="diary-chart-pain-title"] canvas').count(), { timeout: 15_000 }).toBe(2)
    expect((await scripts()).some(s => drawsCharts(s.text)), 'the history loads the charting code').toBe(true)
    // The numbers stay in the table beside each chart, rendered without waiting for it.
    await expect(history.locator('section[aria-labelledby="diary-chart-pain-title"] table tbody tr').count()).resolves.toBe(2)
    await history.context().close()
    await page.close()
  })
})

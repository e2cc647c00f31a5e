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

// Chart.js reads this option, so a script holding it is a charting library; the app draws its
// charts as its own SVG and should ship none.
const drawsCharts = (text: string) => text.includes('maintainAspectRatio')

async function open(page: Page, path: string) {
  await page.goto(url(path))
  await waitForHydration(page, url(path), 'hydration')
  await page.waitForLoadState('networkidle')
}

describe('a lean client', () => {
  it('no patient page loads a charting library; the diary history draws both lines as SVG from the server', async () => {
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
    for (const path of ['/today', '/diary/new', '/diary']) {
      const fresh = await freshPage()
      const scripts = scriptsOf(fresh)
      await open(fresh, path)
      const loaded = await scripts()
      expect(loaded.length, `${path} loads its scripts`).toBeGreaterThan(0)
      expect(loaded.filter(s => drawsCharts(s.text)).map(s => s.url), `${path} loads no charting code`).toEqual([])
      await fresh.context().close()
    }

    // The charts are in the page as the server sent it, before any script runs: one labelled
    // image each, a line through the two entries and a dot for each.
    const history = await freshPage()
    const html = await (await history.request.get(url('/diary'))).text()
    for (const id of ['diary-chart-hot-flushes', 'diary-chart-pain']) {
      const section = html.slice(html.indexOf(`aria-labelledby="${id}-title"`))
      const svg = section.slice(section.indexOf('<svg'), section.indexOf('</svg>'))
      expect(svg, `${id} is drawn on the server`).toContain('role="img"')
      expect(svg.match(/<line[^>]*data-dot/g)?.length, `${id} has a dot per entry`).toBe(2)
      expect(svg).toContain('<polyline')
    }
    await open(history, '/diary')
    for (const id of ['diary-chart-hot-flushes', 'diary-chart-pain']) {
      const chart = history.locator(`section[aria-labelledby="${id}-title"] svg[role="img"]`)
      await expect(chart.getAttribute('aria-label')).resolves.toMatch(/\S/)
      await expect(chart.locator('line[data-dot]').count()).resolves.toBe(2)
      // The drawing has room: the browser gives it a real box.
      const box = await chart.boundingBox()
      expect(box!.width).toBeGreaterThan(100)
      expect(box!.height).toBeGreaterThan(100)
    }
    // The numbers stay in the table beside each chart.
    await expect(history.locator('section[aria-labelledby="diary-chart-pain-title"] table tbody tr').count()).resolves.toBe(2)
    await history.context().close()
    await page.close()
  })
})

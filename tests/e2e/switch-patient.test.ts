import type { Page } from 'playwright-core'
import { describe, expect, it } from 'vitest'
import { url, waitForHydration } from '@nuxt/test-utils/e2e'
import { Client } from '../support/client'
import { linkIn } from '../support/mail-catcher'
import { setupBrowser, signInAs } from '../support/browser'

await setupBrowser()

// Browser tests share one server: this caregiver is used by this file only. Odell and
// Franklin have different demo results (five PSA/testosterone results; an HbA1c and a QTc)
// and a different number of injections, so one man's page cannot pass for the other's.
const HELPER = { name: 'Philippa Quennell', email: 'philippa@demo.tidewell.test', password: 'gulls over the harbour wall' }
const MEN = ['odell@demo.tidewell.test', 'franklin@demo.tidewell.test']

/** An invitation link sent to this address and not used yet, from the app's own mail catcher (read as an admin). */
async function newInvitationLink(email: string, used: Set<string>): Promise<string> {
  const admin = await Client.signIn(url('/'), 'admin@demo.tidewell.test')
  const deadline = Date.now() + 15_000
  while (Date.now() < deadline) {
    const { messages } = (await admin.get('/api/admin/mail')).body as { messages: { to: string, text: string }[] }
    const fresh = messages.filter(m => m.to.includes(email)).map(m => linkIn(m.text)).find(link => !used.has(link))
    if (fresh) {
      used.add(fresh)
      return fresh
    }
    await new Promise(r => setTimeout(r, 200))
  }
  throw new Error(`no new invitation for ${email}`)
}

/** Each man invites her (view only); she accepts both, the first as a new account. */
async function helperOfBoth(): Promise<Client> {
  const helper = new Client(url('/'))
  const used = new Set<string>()
  for (const [index, email] of MEN.entries()) {
    const patient = await Client.signIn(url('/'), email)
    const patientId = (await patient.get('/api/_auth/session')).body.user.patientId as number
    const sent = await patient.post(`/api/patients/${patientId}/circle`, { name: HELPER.name, email: HELPER.email, canLogDiary: false, canManageAppointments: false })
    expect(sent.status, JSON.stringify(sent.body)).toBe(201)
    const token = new URL(await newInvitationLink(HELPER.email, used)).searchParams.get('token')!
    const body = index === 0 ? { name: HELPER.name, password: HELPER.password } : {}
    const accepted = await helper.post(`/api/circle-invitations/${token}/accept`, body)
    expect(accepted.status, JSON.stringify(accepted.body)).toBe(200)
  }
  return helper
}

async function goTo(page: Page, path: string) {
  await page.goto(url(path))
  await waitForHydration(page, url(path), 'hydration')
}

/**
 * From now on, writes down after every change to the page whose name the banner shows and
 * how many of `selector` the page holds then, so a test can see what was shown in between.
 */
async function watchWhatIsShown(page: Page, selector: string) {
  await page.evaluate((selector) => {
    const seen: string[] = []
    const record = () => {
      const name = (document.querySelector('[data-testid="helping-banner"] p')?.textContent ?? '').replace(/\s+/g, ' ').trim()
      seen.push(`${name}|${document.querySelectorAll(selector).length}`)
    }
    record()
    new MutationObserver(record).observe(document.body, { subtree: true, childList: true, characterData: true })
    ;(window as unknown as { seen: string[] }).seen = seen
  }, selector)
}
/** Whether, at some moment since watchWhatIsShown, the banner named `name` while the page held `count`. */
async function wasShown(page: Page, name: string, count: number | undefined) {
  const seen = await page.evaluate(() => (window as unknown as { seen: string[] }).seen)
  expect(seen.length).toBeGreaterThan(1)
  return seen.some(entry => entry.includes(`You are helping: ${name}|`) && entry.endsWith(`|${count}`))
}

describe('a caregiver who helps two men', () => {
  it('sees the second man\'s results and injections after switching, not the first\'s', async () => {
    const helper = await helperOfBoth()
    const records = (await helper.get('/api/me/patients')).body as { patientId: number, name: string }[]
    expect(records).toHaveLength(2)
    // What the server says each man's record holds, read with her own session.
    const labsOf = new Map<number, number>()
    const injectionsOf = new Map<number, number>()
    for (const { patientId } of records) {
      labsOf.set(patientId, ((await helper.get(`/api/patients/${patientId}/labs`)).body as { results: unknown[] }).results.length)
      injectionsOf.set(patientId, ((await helper.get(`/api/patients/${patientId}/injections`)).body as unknown[]).length)
    }
    const [first, second] = records as [{ patientId: number, name: string }, { patientId: number, name: string }]
    expect(labsOf.get(first.patientId)).not.toBe(labsOf.get(second.patientId))
    expect(injectionsOf.get(first.patientId)).not.toBe(injectionsOf.get(second.patientId))

    const page = await signInAs(HELPER.email, HELPER.password)
    const banner = page.getByTestId('helping-banner')
    const RESULTS = 'main article'
    const ROWS = 'main tbody tr'
    const results = page.locator(RESULTS)
    const rows = page.locator(ROWS)

    // Her results page opens on the first man; she switches to the second on that page.
    await goTo(page, '/labs')
    await banner.getByText(`You are helping: ${first.name}`).waitFor()
    await expect.poll(() => results.count(), { timeout: 10_000 }).toBe(labsOf.get(first.patientId))
    await watchWhatIsShown(page, RESULTS)
    await banner.getByRole('button', { name: `Switch to ${second.name}` }).click()
    await banner.getByText(`You are helping: ${second.name}`).waitFor()
    await expect.poll(() => results.count(), { timeout: 10_000 }).toBe(labsOf.get(second.patientId))
    // At no moment did the page show the first man's results under the second man's name.
    expect(await wasShown(page, second.name, labsOf.get(first.patientId))).toBe(false)
    expect(await wasShown(page, second.name, labsOf.get(second.patientId))).toBe(true)

    // The same on the injection history, switching back to the first man.
    await goTo(page, '/injections')
    await banner.getByText(`You are helping: ${second.name}`).waitFor()
    await expect.poll(() => rows.count(), { timeout: 10_000 }).toBe(injectionsOf.get(second.patientId))
    await watchWhatIsShown(page, ROWS)
    await banner.getByRole('button', { name: `Switch to ${first.name}` }).click()
    await banner.getByText(`You are helping: ${first.name}`).waitFor()
    await expect.poll(() => rows.count(), { timeout: 10_000 }).toBe(injectionsOf.get(first.patientId))
    expect(await wasShown(page, first.name, injectionsOf.get(second.patientId))).toBe(false)
    expect(await wasShown(page, first.name, injectionsOf.get(first.patientId))).toBe(true)

    // Drawn by the server after the switch back: the first man's results again.
    await goTo(page, '/labs')
    await banner.getByText(`You are helping: ${first.name}`).waitFor()
    await expect.poll(() => results.count(), { timeout: 10_000 }).toBe(labsOf.get(first.patientId))
    await page.close()
  })
})

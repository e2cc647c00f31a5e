import { describe, expect, it } from 'vitest'
import { url, waitForHydration } from '@nuxt/test-utils/e2e'
import { Client } from '../support/client'
import { linkIn } from '../support/mail-catcher'
import { createPage, seriousAxeViolations, setupBrowser, signInAs } from '../support/browser'

await setupBrowser()

// Browser tests share one server: this demo patient's password is changed by this file only.
const PATIENT = 'mateo@demo.tidewell.test'
const NEW_PASSWORD = 'lanterns along the quiet river'

/** The newest reset link sent to one address, from the app's own mail catcher (read as an admin). */
async function resetLink(email: string): Promise<string> {
  const visitor = new Client(url('/'))
  expect((await visitor.post('/api/auth/forgot-password', { email })).status).toBe(202)
  const admin = await Client.signIn(url('/'), 'admin@demo.tidewell.test')
  const deadline = Date.now() + 15_000
  while (Date.now() < deadline) {
    const { messages } = (await admin.get('/api/admin/mail')).body as { messages: { to: string, text: string }[] }
    const found = messages.filter(m => m.to.includes(email))
    if (found.length) return linkIn(found.at(-1)!.text)
    await new Promise(r => setTimeout(r, 200))
  }
  throw new Error(`no reset e-mail for ${email}`)
}

describe('choosing a new password from a reset link', () => {
  it('refuses a short or mismatched password at the field; a request that never answers gives the button back with a message; the retry saves it and the new one signs in', async () => {
    const link = new URL(await resetLink(PATIENT))
    expect(link.pathname).toBe('/set-password')
    const page = await createPage(`${link.pathname}${link.search}`)
    await waitForHydration(page, url(`${link.pathname}${link.search}`), 'hydration')
    await page.getByRole('heading', { level: 1, name: 'Choose a new password' }).waitFor()
    expect(await seriousAxeViolations(page)).toEqual([])

    const password = page.getByLabel('New password', { exact: true })
    const again = page.getByLabel('Type the new password again')
    const save = page.getByRole('button', { name: 'Save password' })
    const describedBy = (await password.getAttribute('aria-describedby'))!.split(/\s+/)
    const descriptions = await Promise.all(describedBy.map(id => page.locator(`[id="${id}"]`).textContent()))
    expect(descriptions.join(' ')).toContain('at least 12 characters')

    await password.fill('too short')
    await again.fill('too short')
    await save.click()
    await page.getByText('Use at least 12 characters.', { exact: true }).waitFor()
    expect(await password.getAttribute('aria-invalid')).toBe('true')

    await password.fill(NEW_PASSWORD)
    await again.fill(`${NEW_PASSWORD}s`)
    await save.click()
    await page.getByText('The two passwords are not the same.').waitFor()

    // The server never answers this one (the request is held, not failed): the page must not
    // stay disabled. It gives up after its timeout, says the connection failed, and lets him retry.
    await page.route('**/api/auth/set-password', () => {})
    await again.fill(NEW_PASSWORD)
    await save.click()
    await page.getByText('could not reach', { exact: false }).waitFor({ timeout: 40_000 })
    expect(await save.isDisabled()).toBe(false)

    await page.unroute('**/api/auth/set-password')
    await save.click()
    await page.getByText('Your password is saved. You can sign in now.').waitFor()
    await page.close()

    // The same link a second time is spent.
    const reuse = await new Client(url('/')).post('/api/auth/set-password', { token: link.searchParams.get('token'), password: 'another long enough sentence' })
    expect(reuse.status).toBe(400)

    const signedIn = await signInAs(PATIENT, NEW_PASSWORD)
    expect(new URL(signedIn.url()).pathname).toBe('/today')
    await signedIn.close()
  }, 90_000)
})

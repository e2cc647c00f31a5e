import { describe, expect, it } from 'vitest'
import { createPage, seriousAxeViolations, setupBrowser, signInAs } from '../support/browser'

await setupBrowser()

describe('signing in', () => {
  it('the sign-in page has no serious or critical axe-core violations', async () => {
    const page = await createPage('/sign-in')
    expect(await seriousAxeViolations(page)).toEqual([])
    await page.close()
  })

  it('a patient lands on Today', async () => {
    const page = await signInAs('patient@demo.tidewell.test')
    expect(new URL(page.url()).pathname).toBe('/today')
    await page.getByRole('heading', { level: 1, name: 'Hello, Elias Marwood' }).waitFor()
    await expect.poll(() => page.getByText('In an emergency, call 911 now.').count(), { timeout: 10_000 }).toBe(1)
    await page.close()
  })

  it('a nurse lands on the triage queue, with the patients one link away', async () => {
    const page = await signInAs('nurse2@demo.tidewell.test')
    expect(new URL(page.url()).pathname).toBe('/staff/triage')
    await page.getByRole('heading', { level: 1, name: 'Triage queue' }).waitFor()
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Patients' }).click()
    await page.getByRole('heading', { level: 1, name: 'Patients' }).waitFor()
    await page.getByRole('link', { name: 'Elias Marwood' }).waitFor()
    await page.close()
  })

  it('a wrong password shows the message in words, without moving on', async () => {
    const page = await createPage('/sign-in')
    await page.getByLabel('E-mail address').fill('desmond@demo.tidewell.test')
    await page.getByLabel('Password').fill('definitely wrong')
    await page.getByRole('button', { name: 'Sign in' }).click()
    await expect(page.getByRole('alert').textContent()).resolves.toContain('do not match an account')
    expect(new URL(page.url()).pathname).toBe('/sign-in')
    await page.close()
  })

  it('the language switch turns the page Spanish', async () => {
    const page = await createPage('/sign-in')
    await page.getByRole('button', { name: 'Español' }).click()
    await page.getByRole('heading', { name: 'Iniciar sesión en Tidewell' }).waitFor()
    expect(await page.getAttribute('html', 'lang')).toMatch(/^es/)
    await expect(page.getByRole('button', { name: 'Español' }).getAttribute('aria-pressed')).resolves.toBe('true')
    await page.close()
  })

  it('a signed-out visitor asking for a staff page is sent to sign in', async () => {
    const page = await createPage('/staff')
    await page.waitForURL(u => u.pathname === '/sign-in')
    expect(new URL(page.url()).searchParams.get('next')).toBe('/staff')
    await page.close()
  })
})

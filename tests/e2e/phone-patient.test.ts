import type { Page } from 'playwright-core'
import { describe, expect, it } from 'vitest'
import { createPage, setupBrowser, signInAs } from '../support/browser'

await setupBrowser()

// Issue 17 on a 390 x 844 phone. Read-only checks on shared demo people (patient@ is Elias
// Marwood; caregiver@ is Marisol, his helper who may log and confirm; dana@ helps Bernard,
// view only, server/db/seed/demo.ts).
const PHONE = { width: 390, height: 844 }
const SHOTS = '/tmp/phone-shots'

async function onPhone(page: Page) {
  await page.setViewportSize(PHONE)
}

async function signInOnPhone(email: string): Promise<Page> {
  const page = await signInAs(email)
  await onPhone(page)
  await page.reload()
  await page.getByRole('heading', { level: 1 }).waitFor()
  return page
}

describe('the patient on his phone', () => {
  it('sees the next injection, the appointment and its one action inside the first screen', async () => {
    const page = await signInOnPhone('patient@demo.tidewell.test')
    await page.screenshot({ path: `${SHOTS}/today-patient.png`, fullPage: true })
    const bottom = async (selector: string) => {
      const box = await page.locator(selector).first().boundingBox()
      expect(box, selector).not.toBeNull()
      return box!.y + box!.height
    }
    expect(await bottom('[data-testid="due-date"]')).toBeLessThanOrEqual(PHONE.height)
    expect(await bottom('[data-testid="appointment-when"]')).toBeLessThanOrEqual(PHONE.height)
    // The one action: Confirm, or the waiting note, or the calendar file once confirmed.
    const action = page.locator('#appointment-heading ~ div button.tw-button-primary, [data-testid="request-waiting"], a[href$="calendar.ics"]')
    const box = await action.first().boundingBox()
    expect(box).not.toBeNull()
    expect(box!.y + box!.height).toBeLessThanOrEqual(PHONE.height)
    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth)
    expect(overflow).toBeLessThanOrEqual(0)
  })

  it('marks the language in use with aria-current and folds the menu behind an accessible button', async () => {
    const page = await signInOnPhone('patient@demo.tidewell.test')
    await expect(page.getByRole('button', { name: 'English' }).getAttribute('aria-current')).resolves.toBe('true')
    await expect(page.getByRole('button', { name: 'Español' }).getAttribute('aria-current')).resolves.toBeNull()
    const menu = page.getByTestId('menu-button')
    await expect(menu.getAttribute('aria-expanded')).resolves.toBe('false')
    expect(await page.getByRole('navigation', { name: 'Main' }).isVisible()).toBe(false)
    await menu.click()
    await expect(menu.getAttribute('aria-expanded')).resolves.toBe('true')
    await page.getByRole('link', { name: 'Injections' }).focus()
    await page.keyboard.press('Escape')
    await expect(menu.getAttribute('aria-expanded')).resolves.toBe('false')
    expect(await page.evaluate(() => document.activeElement?.getAttribute('data-testid'))).toBe('menu-button')
  })

  it('marks the section of a sub-page in the menu', async () => {
    const page = await signInAs('patient@demo.tidewell.test')
    await page.goto(page.url().replace('/today', '/diary/new'))
    const diary = page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Diary' })
    await expect(diary.getAttribute('aria-current')).resolves.toBe('page')
    await expect(page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Today' }).getAttribute('aria-current')).resolves.toBeNull()
  })

  it('puts focus on the main heading after signing in', async () => {
    const page = await signInAs('patient@demo.tidewell.test')
    await expect.poll(() => page.evaluate(() => document.activeElement?.tagName)).toBe('H1')
    await expect.poll(() => page.getByTestId('route-announcer').textContent()).toContain('Hello')
  })
})

describe('sign-in on a phone', () => {
  it('shows only the errors of the new try', async () => {
    const page = await createPage('/sign-in')
    await onPhone(page)
    await page.getByLabel(/e-mail/i).fill('patient@demo.tidewell.test')
    await page.getByLabel(/^password$/i).fill('not the password')
    await page.getByRole('button', { name: /^sign in$/i }).click()
    const alert = page.getByRole('alert').filter({ hasNotText: /^$/ })
    await alert.first().waitFor()
    await page.screenshot({ path: `${SHOTS}/sign-in-error.png`, fullPage: true })
    await page.getByLabel(/e-mail/i).fill('')
    await page.getByRole('button', { name: /^sign in$/i }).click()
    await expect.poll(() => page.locator('.tw-field-error').count()).toBeGreaterThan(0)
    // The server's refusal of the last try is gone; only the field's error is left.
    await expect.poll(() => page.locator('form').evaluate(f => f.previousElementSibling?.getAttribute('role') ?? null)).not.toBe('alert')
    await page.screenshot({ path: `${SHOTS}/sign-in.png`, fullPage: true })
  })
})

describe('access history on a phone', () => {
  it('is grouped and says who looked and why', async () => {
    // His daughter opens his record a few times, so there are looks to group.
    const helper = await signInOnPhone('caregiver@demo.tidewell.test')
    for (const path of ['/injections', '/labs', '/today']) await helper.goto(helper.url().replace(/\/[a-z-]+(\?.*)?$/, path))
    const page = await signInOnPhone('patient@demo.tidewell.test')
    await page.goto(page.url().replace('/today', '/access-history'))
    await page.getByRole('heading', { level: 1, name: 'Access history' }).waitFor()
    await page.screenshot({ path: `${SHOTS}/access-history.png`, fullPage: true })
    const items = page.getByTestId('access-history-item')
    const count = await items.count()
    expect(count).toBeGreaterThan(0)
    expect(count).toBeLessThanOrEqual(30)
    await expect(items.first().textContent()).resolves.toMatch(/care circle: you gave this person access/)
  })
})

describe('his daughter on her phone', () => {
  it('is spoken to about him, not as the patient', async () => {
    const page = await signInOnPhone('dana@demo.tidewell.test')
    await page.screenshot({ path: `${SHOTS}/today-caregiver.png`, fullPage: true })
    const text = await page.locator('main').textContent()
    expect(text).toContain('for Bernard')
    expect(text).not.toContain('Your weekly diary is due')
  })

  it('is told why a page she may not open brought her to Today', async () => {
    const page = await signInOnPhone('caregiver@demo.tidewell.test')
    await page.goto(page.url().replace('/today', '/access-history'))
    const notice = page.getByTestId('not-allowed-notice')
    await notice.waitFor()
    await expect(notice.textContent()).resolves.toContain('Elias')
    await page.screenshot({ path: `${SHOTS}/today-caregiver-not-allowed.png`, fullPage: true })
  })
})

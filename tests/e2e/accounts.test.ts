import { describe, expect, it } from 'vitest'
import { url, waitForHydration } from '@nuxt/test-utils/e2e'
import { Client } from '../support/client'
import { seriousAxeViolations, setupBrowser, signInAs } from '../support/browser'

await setupBrowser()

// Browser tests share one server: this file switches off only an account it makes itself.
const PERSON = { name: 'Rosalind Quarrie', email: 'rosalind@demo.tidewell.test' }

describe('the admin page deactivates and reactivates an account', () => {
  it('with a confirmation, by keyboard, the state in words, at 320 px', async () => {
    const api = await Client.signIn(url('/'), 'admin@demo.tidewell.test')
    const made = await api.post('/api/users', { ...PERSON, role: 'caregiver', language: 'en' })
    expect(made.status, JSON.stringify(made.body)).toBe(201)

    const page = await signInAs('admin@demo.tidewell.test')
    await page.setViewportSize({ width: 320, height: 800 })
    await page.goto(url('/admin'))
    await waitForHydration(page, url('/admin'), 'hydration')
    const row = page.getByRole('row').filter({ hasText: PERSON.email })
    await row.getByText('Invited, no password yet').waitFor()
    // His own row offers no button.
    expect(await page.getByRole('row').filter({ hasText: 'admin@demo.tidewell.test' }).getByRole('button').count()).toBe(0)

    await row.getByRole('button', { name: `Deactivate the account of ${PERSON.name}` }).focus()
    await page.keyboard.press('Enter')
    const confirm = row.getByRole('group', { name: `Deactivate the account of ${PERSON.name}` })
    await confirm.getByText(`Deactivate ${PERSON.name}'s account?`, { exact: false }).waitFor()
    // Cancel first: nothing changes, focus goes back to the button.
    await confirm.getByRole('button', { name: 'Cancel' }).click()
    await expect.poll(() => row.getByRole('button', { name: `Deactivate the account of ${PERSON.name}` }).evaluate(el => el === document.activeElement)).toBe(true)
    await page.keyboard.press('Enter')
    await expect.poll(() => row.getByRole('button', { name: 'Yes, deactivate' }).evaluate(el => el === document.activeElement)).toBe(true)
    expect(await seriousAxeViolations(page)).toEqual([])
    await page.keyboard.press('Enter')

    await page.getByRole('status').getByText(`${PERSON.name}'s account is deactivated.`, { exact: false }).waitFor()
    await row.getByText('Deactivated', { exact: true }).waitFor()
    await expect(page.evaluate(() => document.documentElement.scrollWidth)).resolves.toBeLessThanOrEqual(320)
    const list = (await api.get('/api/users')).body as { email: string, active: boolean }[]
    expect(list.find(u => u.email === PERSON.email)!.active).toBe(false)

    await row.getByRole('button', { name: `Reactivate the account of ${PERSON.name}` }).click()
    await row.getByRole('button', { name: 'Yes, reactivate' }).click()
    await page.getByRole('status').getByText(`${PERSON.name}'s account is active again.`).waitFor()
    await row.getByText('Invited, no password yet').waitFor()
  })
})

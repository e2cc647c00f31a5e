import { describe, expect, it } from 'vitest'
import { url, waitForHydration } from '@nuxt/test-utils/e2e'
import { setupBrowser, signInAs } from '../support/browser'

await setupBrowser()

describe('a hidden character in a form field', () => {
  it('the regimen form shows the field message without sending; once retyped it saves (the number field still gives a number)', async () => {
    const page = await signInAs('clinician@demo.tidewell.test')
    await page.goto(url('/staff/regimens'))
    await waitForHydration(page, url('/staff/regimens'), 'hydration')
    const posts: string[] = []
    page.on('request', (request) => {
      if (request.method() === 'POST' && request.url().includes('/api/regimens')) posts.push(request.url())
    })

    await page.getByLabel('Name', { exact: true }).fill('Pauta de 10 semanas \u202Eañ')
    await page.getByLabel('Days between injections').fill('70')
    await page.getByRole('button', { name: 'Add a regimen' }).click()
    await page.getByText('This text contains a hidden or control character. Please type it again.').waitFor()
    expect(await page.getByLabel('Name', { exact: true }).getAttribute('aria-invalid')).toBe('true')
    expect(posts).toEqual([])

    await page.getByLabel('Name', { exact: true }).fill('Pauta de 10 semanas (señalada)')
    await page.getByRole('button', { name: 'Add a regimen' }).click()
    await page.getByText('Regimen added.').waitFor()
    expect(posts).toHaveLength(1)
    await page.getByText('Pauta de 10 semanas (señalada)').first().waitFor()
    await page.close()
  })
})

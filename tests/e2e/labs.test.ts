import { describe, expect, it } from 'vitest'
import { seriousAxeViolations, setupBrowser, signInAs, url } from '../support/browser'

await setupBrowser()

// Browser tests share one server: this file enters results for Odell Pruitt (LPU-1004), whose
// other browser test (diary.test.ts) writes his diary, not his labs.
//
// Expected words are worked from the sources in REFERENCES.md: castrate testosterone is below
// 50 ng/dL (Oefelein 2000); nmol/L = ng/dL x 0.03467, so 40 ng/dL is 1.3868, shown 1.39.

describe('lab results in the browser', () => {
  it('a nurse enters a testosterone result on his page, and he reads it in plain words on his results page', async () => {
    const nurse = await signInAs('nurse@demo.tidewell.test')
    await nurse.goto(url('/staff'))
    await nurse.getByRole('link', { name: 'Odell Pruitt' }).click()
    await nurse.getByRole('heading', { level: 1, name: 'Odell Pruitt' }).waitFor()
    const form = nurse.locator('form[aria-labelledby="lab-entry-heading"]')
    await form.getByLabel('Test', { exact: true }).selectOption('testosterone')
    await form.getByLabel('Testosterone level').fill('40')
    await form.getByRole('radio', { name: 'ng/dL' }).check()
    await form.getByRole('button', { name: 'Save result' }).click()
    await form.getByText('Result saved. It needs no queue item.').waitFor()
    await expect.poll(() => nurse.getByText('40 ng/dL = 1.39 nmol/L (entered as 40 ng/dL)').count(), { timeout: 10_000 }).toBe(1)
    await nurse.getByText('Castrate level (below 50 ng/dL)').first().waitFor()
    expect(await seriousAxeViolations(nurse)).toEqual([])

    // A value outside the range the form accepts is refused at its field, nothing saved.
    await form.getByLabel('Testosterone level').fill('5000')
    await form.getByRole('button', { name: 'Save result' }).click()
    await form.locator('#lab-value-error').waitFor()
    await nurse.close()

    const odell = await signInAs('odell@demo.tidewell.test')
    await odell.goto(url('/labs'))
    await odell.getByText('40 ng/dL (1.39 nmol/L)').first().waitFor()
    await odell.getByText('Your testosterone is at the level the treatment aims for (below 50 ng/dL).').first().waitFor()
    expect(await seriousAxeViolations(odell)).toEqual([])
    await odell.close()
  })
})

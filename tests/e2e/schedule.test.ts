import { describe, expect, it } from 'vitest'
import { seriousAxeViolations, setupBrowser, signInAs, url } from '../support/browser'

await setupBrowser()

// Browser tests share one server: these use Elias (LPU-1001, his appointment), Howard
// (LPU-1011, overdue) and Franklin's appointment (LPU-1005, booked), which no other browser
// test changes (the diary test writes Franklin's diary, not his schedule).

describe('the injection schedule in the browser', () => {
  it('the demo patient sees his next injection on Today, confirms the appointment, and its state changes', async () => {
    const page = await signInAs('patient@demo.tidewell.test')
    expect(new URL(page.url()).pathname).toBe('/today')
    const card = page.locator('section[aria-labelledby="next-injection-heading"]')
    await card.getByRole('heading', { name: 'Next injection' }).waitFor()
    await expect(card.locator('[data-state]').textContent()).resolves.toContain('Window open')
    await expect(card.getByTestId('due-date').textContent()).resolves.toMatch(/\d{4}/)
    await expect(card.getByTestId('due-date').textContent()).resolves.toContain('6 days to go')
    await expect(card.getByTestId('appointment-status').textContent()).resolves.toContain('Waiting for confirmation')
    await expect(card.getByRole('link', { name: 'Add to calendar' }).getAttribute('href')).resolves.toMatch(/^\/api\/appointments\/\d+\/calendar\.ics$/)
    expect(await seriousAxeViolations(page)).toEqual([])

    await card.getByRole('button', { name: 'Confirm this appointment' }).click()
    await card.getByText('Thank you. The appointment is confirmed.').waitFor()
    await expect(card.getByTestId('appointment-status').textContent()).resolves.toContain('Confirmed')
    await expect.poll(() => card.getByRole('button', { name: 'Confirm this appointment' }).count(), { timeout: 10_000 }).toBe(0)

    await page.reload()
    await expect(page.getByTestId('appointment-status').textContent()).resolves.toContain('Confirmed')
    await page.close()
  })

  it('a nurse records an injection for an overdue patient and the due list moves him', async () => {
    const page = await signInAs('nurse@demo.tidewell.test')
    await page.goto(url('/staff/due'))
    await page.getByRole('heading', { level: 1, name: 'Due list' }).waitFor()
    const overdue = page.locator('section[data-group="overdue"]')
    await overdue.locator('[data-patient="LPU-1011"]').waitFor()
    const overdueBefore = await overdue.locator('tbody tr').count()
    expect(await seriousAxeViolations(page)).toEqual([])

    await overdue.getByRole('link', { name: 'Howard Tillinghast' }).click()
    await page.getByRole('heading', { level: 1, name: 'Howard Tillinghast' }).waitFor()
    const form = page.locator('form[aria-labelledby="record-heading"]')
    await form.getByLabel('Lot number').fill('LQ7781T')
    await form.getByLabel('Lot expiry date').fill('2030-06-30')
    await expect.poll(() => form.getByRole('radio', { checked: true }).count(), { timeout: 10_000 }).toBe(1)
    await form.getByRole('button', { name: 'Record injection' }).click()
    await form.getByText('Injection recorded.').waitFor()
    await page.locator('section[aria-labelledby="schedule-heading"] [data-state="upcoming"]').waitFor()
    await expect.poll(() => page.locator('table').last().textContent(), { timeout: 10_000 }).toContain('LQ7781T')

    await page.goto(url('/staff/due'))
    await page.getByRole('heading', { level: 1, name: 'Due list' }).waitFor()
    await expect.poll(() => page.locator('[data-patient="LPU-1011"]').count(), { timeout: 10_000 }).toBe(0)
    await expect.poll(() => page.locator('section[data-group="overdue"] tbody tr').count(), { timeout: 10_000 }).toBe(overdueBefore - 1)
    await page.close()
  })

  it('after he asks for another time, the card says the request is with the clinic and no longer offers Confirm (issue 17)', async () => {
    const page = await signInAs('franklin@demo.tidewell.test')
    const card = page.locator('section[aria-labelledby="next-injection-heading"]')
    await card.getByRole('button', { name: 'Confirm this appointment' }).waitFor()
    await card.getByRole('button', { name: 'Ask for another time' }).click()
    const form = card.locator('form[aria-labelledby="change-request-heading"]')
    const today = await page.evaluate(() => new Date().toISOString().slice(0, 10))
    const inTwoWeeks = new Date(Date.parse(`${today}T12:00:00Z`) + 14 * 86_400_000).toISOString().slice(0, 10)
    await form.getByLabel('First choice').fill(inTwoWeeks)
    await form.getByRole('button', { name: 'Send request' }).click()
    await card.getByText('Your request was sent to the clinic.', { exact: false }).waitFor()
    await expect.poll(() => card.getByRole('button', { name: 'Confirm this appointment' }).count(), { timeout: 10_000 }).toBe(0)
    await expect.poll(() => card.getByRole('button', { name: 'Ask for another time' }).count(), { timeout: 10_000 }).toBe(0)
    expect(await seriousAxeViolations(page)).toEqual([])
    // Still so after a reload: it is the stored state, not the page's memory.
    await page.reload()
    await card.getByRole('heading', { name: 'Next injection' }).waitFor()
    expect(await card.getByRole('button', { name: 'Confirm this appointment' }).count()).toBe(0)
    await page.close()
  })
})

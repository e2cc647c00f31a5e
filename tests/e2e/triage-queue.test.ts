import { describe, expect, inject, it } from 'vitest'
import { url } from '@nuxt/test-utils/e2e'
import { seriousAxeViolations, setupBrowser, signInAs } from '../support/browser'
import { Client } from '../support/client'
import { diaryEntry } from '../support/diary'

await setupBrowser()

// Browser tests share one server: this patient is used by this file only.
const PATIENT = 'bernard@demo.tidewell.test'
const CLINIC_NUMBER = 'LPU-1002'
const NURSE = 'nurse2@demo.tidewell.test'
const NOTE = 'Some blood since Tuesday.\n<b>not bold</b>'

async function sendUrgentEntry(patient: Client, patientId: number, note?: string) {
  // Blood in the urine is urgent (issue 4 defaults, common practice).
  const reply = await patient.post(`/api/patients/${patientId}/diary`, diaryEntry({ urinary: { blood: true }, ...(note ? { note } : {}) }))
  expect(reply.status).toBe(201)
  expect(reply.body.level).toBe('urgent')
  return reply.body as { id: number }
}

describe('the triage queue', () => {
  it('a nurse finds an urgent item, claims it, logs a call, sets an outcome and closes it; the patient then sees the outcome', async () => {
    const patient = await Client.signIn(inject('appUrl'), PATIENT)
    const patientId = (await patient.get('/api/_auth/session')).body.user.patientId as number
    const entry = await sendUrgentEntry(patient, patientId, NOTE)

    // The nurse lands on the queue and narrows it to this patient; the filter is in the address.
    const page = await signInAs(NURSE)
    expect(new URL(page.url()).pathname).toBe('/staff/triage')
    await page.getByRole('heading', { level: 1, name: 'Triage queue' }).waitFor()
    const search = page.getByLabel('Patient name or clinic number')
    await search.fill(CLINIC_NUMBER)
    await page.getByRole('button', { name: 'Search', exact: true }).click()
    await page.waitForURL(u => u.searchParams.get('q') === CLINIC_NUMBER)
    // Other browser tests may have filled the queue; wait until only his item is listed.
    await page.waitForFunction(number => [...document.querySelectorAll('tbody tr')].every(tr => tr.textContent?.includes(number)), CLINIC_NUMBER)
    const rows = page.locator('tbody tr')
    await expect.poll(() => rows.count(), { timeout: 10_000 }).toBe(1)
    const row = rows.first()
    await expect(row.textContent()).resolves.toContain('Blood in the urine.')
    // Urgent target: 4 hours (clinic default), so a fresh item is due in about 4 hours.
    await expect(row.textContent()).resolves.toMatch(/due in [34] h( \d+ min)?/)
    await expect(row.textContent()).resolves.toContain('Nobody yet')
    await expect(page.locator('[data-count="urgent"]').textContent()).resolves.toMatch(/Urgent\s*1 item/)
    expect(await seriousAxeViolations(page)).toEqual([])

    // A reload keeps the filter.
    await page.reload()
    await expect(page.getByLabel('Patient name or clinic number').inputValue()).resolves.toBe(CLINIC_NUMBER)
    await expect.poll(() => rows.count(), { timeout: 10_000 }).toBe(1)

    // While the page is open, a second entry arrives: the list updates itself in place,
    // the search box keeps the focus and the change in the counts is announced.
    await page.getByLabel('Patient name or clinic number').focus()
    await sendUrgentEntry(patient, patientId)
    await page.waitForFunction(() => document.querySelectorAll('tbody tr').length === 2, undefined, { timeout: 45_000 })
    await expect(page.evaluate(() => document.activeElement?.id)).resolves.toBe('queue-search')
    await expect(page.getByRole('status').filter({ hasText: 'The queue has changed' }).textContent()).resolves.toContain('2 urgent')

    // The first item (closest respond-by time) is the entry sent first.
    await rows.first().getByRole('link', { name: /Bernard Achterberg/ }).click()
    await page.getByRole('heading', { level: 1, name: 'Bernard Achterberg' }).waitFor()
    const reasons = page.getByRole('region', { name: 'Why this item is here' })
    await expect(reasons.textContent()).resolves.toContain('Blood in the urine.')
    await page.getByText('Entered by the patient, Bernard Achterberg').waitFor()
    // The patient's note is text, exactly as typed, never markup.
    await expect(page.locator('[data-entry-note]').textContent()).resolves.toBe(NOTE)
    await expect.poll(() => page.locator('[data-entry-note] b').count(), { timeout: 10_000 }).toBe(0)
    await page.getByRole('heading', { name: 'Last eight diary entries' }).waitFor()
    const closeButton = page.getByRole('button', { name: 'Close item' })
    await expect(closeButton.isDisabled()).resolves.toBe(true)
    await page.getByText('Closing needs an outcome. Choose one above and save it first.').waitFor()
    expect(await seriousAxeViolations(page)).toEqual([])

    await page.getByRole('button', { name: 'Claim this item' }).click()
    await page.getByRole('status').filter({ hasText: 'You claimed this item.' }).waitFor()
    await expect(page.locator('[data-assignee]').textContent()).resolves.toContain('Tobias Mwangi')

    const call = page.getByRole('form', { name: 'Log a call' })
    await call.getByRole('button', { name: 'Log call' }).click()
    await call.getByText('Choose whether you reached the patient.').waitFor()
    await call.getByRole('radio', { name: 'Reached', exact: true }).check()
    await call.getByLabel('Note (optional)').fill('Spoke with him; he will come in tomorrow.')
    await call.getByRole('button', { name: 'Log call' }).click()
    await page.getByRole('status').filter({ hasText: 'Call logged.' }).waitFor()

    const outcome = page.getByRole('form', { name: 'Outcome', exact: true })
    await outcome.getByRole('radio', { name: 'Clinic visit booked' }).check()
    await outcome.getByRole('button', { name: 'Save outcome' }).click()
    await page.getByRole('status').filter({ hasText: 'Outcome saved.' }).waitFor()

    await expect(closeButton.isEnabled()).resolves.toBe(true)
    await closeButton.click()
    await page.getByRole('status').filter({ hasText: 'Item closed.' }).waitFor()
    await expect(page.locator('[data-status]').textContent()).resolves.toMatch(/Closed\s*·\s*Clinic visit booked/)
    const timeline = page.locator('[data-event]')
    await expect(timeline.evaluateAll(items => items.map(item => item.getAttribute('data-event')))).resolves
      .toEqual(['created', 'claimed', 'call-reached', 'disposition-set', 'closed'])
    await page.getByText('Spoke with him; he will come in tomorrow.').waitFor()
    await page.getByText('Tobias Mwangi, Nurse').first().waitFor()
    await page.close()

    // The patient sees on his diary history that the care team dealt with it, and how.
    const history = (await patient.get(`/api/patients/${patientId}/diary`)).body.entries as { id: number, review: unknown }[]
    expect(history.find(e => e.id === entry.id)?.review).toEqual({ status: 'closed', disposition: 'visit-booked', closedAt: expect.any(String) })
    const own = await signInAs(PATIENT)
    await own.goto(url('/diary'))
    await own.getByRole('heading', { level: 1, name: 'Your diary' }).waitFor()
    await own.getByText('The care team has dealt with this. What the care team did: The clinic booked a visit for you').waitFor()
    await own.close()
  })
})

import { describe, expect, it } from 'vitest'
import { seriousAxeViolations, setupBrowser, signInAs, url } from '../support/browser'

await setupBrowser()

// Browser tests share one server: these use Elias (LPU-1001, his appointment), Howard
// (LPU-1011, overdue), Franklin's appointment (LPU-1005, booked) and Ramón's (LPU-1007,
// confirmed; he reads Spanish), which no other browser test changes (the diary test writes
// Franklin's diary and the triage test Ramón's, not their schedules).

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
    await expect.poll(() => page.locator('section[aria-labelledby="history-heading"] table').textContent(), { timeout: 10_000 }).toContain('LQ7781T')

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

  it('Ramón asks in Spanish to cancel, the nurse cancels with a reason, and his Today says why and that the injection is still due', async () => {
    const patient = await signInAs('ramon@demo.tidewell.test')
    const card = patient.locator('section[aria-labelledby="next-injection-heading"]')
    await card.getByRole('button', { name: 'Pedir que se cancele' }).click()
    const form = card.locator('form[aria-labelledby="cancel-request-heading"]')
    await form.getByLabel('Por qué, o qué le convendría (opcional)').fill('Estaré fuera esa semana.')
    await form.getByRole('button', { name: 'Enviar la solicitud de cancelación' }).click()
    await card.getByText('Su solicitud de cancelación se envió a la clínica.', { exact: false }).waitFor()
    await card.getByText('Esperando la respuesta de la clínica a su solicitud de cancelación.', { exact: false }).waitFor()
    expect(await seriousAxeViolations(patient)).toEqual([])

    const nurse = await signInAs('nurse@demo.tidewell.test')
    await nurse.goto(url('/staff/due'))
    const requests = nurse.locator('[data-open-requests]')
    await requests.getByText('Asks to cancel').waitFor()
    await requests.getByRole('link', { name: 'Ramón Espinal Tovar' }).click()
    await nurse.getByRole('heading', { level: 1, name: 'Ramón Espinal Tovar' }).waitFor()
    // He asked to cancel: the cancel form is already open under his request.
    await nurse.getByRole('heading', { name: 'He asked to cancel' }).waitFor()
    const cancel = nurse.locator('form[aria-labelledby="cancel-appointment-heading"]')
    await cancel.getByRole('button', { name: 'Cancel the appointment' }).click()
    await cancel.getByText('Give the reason for cancelling', { exact: false }).waitFor()
    await cancel.getByLabel('Reason (he will read it)').fill('Cancelada como pidió; llámenos para una fecha a su regreso.')
    expect(await seriousAxeViolations(nurse)).toEqual([])
    await cancel.getByRole('button', { name: 'Cancel the appointment' }).click()
    await nurse.getByText('The appointment is cancelled and he has been told.', { exact: false }).waitFor()
    await nurse.getByText('The last appointment', { exact: false }).waitFor()
    await nurse.close()

    await patient.reload()
    const told = patient.getByTestId('appointment-cancelled')
    await told.waitFor()
    await expect(told.textContent()).resolves.toContain('La clínica canceló su cita del')
    await expect(told.textContent()).resolves.toContain('Cancelada como pidió; llámenos para una fecha a su regreso.')
    await expect(told.textContent()).resolves.toContain('Su inyección sigue pendiente.')
    await patient.close()
  })
})

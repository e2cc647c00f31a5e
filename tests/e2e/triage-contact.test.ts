import { randomUUID } from 'node:crypto'
import { describe, expect, inject, it } from 'vitest'
import type { Page } from 'playwright-core'
import { url, waitForHydration } from '@nuxt/test-utils/e2e'
import { seriousAxeViolations, setupBrowser, signInAs } from '../support/browser'
import { Client } from '../support/client'
import { diaryEntry } from '../support/diary'

await setupBrowser()

// Browser tests share one server: these patients are used by this file only. Both read
// Tidewell in Spanish, so their pages are checked in Spanish; the nurse reads English.
const PHONE_PATIENT = { email: 'mateo@demo.tidewell.test', clinicNumber: 'LPU-1012' }
const OUTCOME_PATIENT = { email: 'ramon@demo.tidewell.test', clinicNumber: 'LPU-1007' }
const NURSE = 'nurse@demo.tidewell.test'
// Fictional numbers (the 555-01xx range is set aside for fiction).
const MOBILE = '(312) 555-0142'
const HOME = '(312) 555-0187'

async function goTo(page: Page, path: string) {
  await page.goto(url(path))
  await waitForHydration(page, url(path), 'hydration')
}

async function patientIdOf(client: Client) {
  return (await client.get('/api/_auth/session')).body.user.patientId as number
}

/** The open queue item of this patient that came from this diary entry. */
async function itemOfEntry(nurse: Client, clinicNumber: string, entryId: number) {
  const queue = await nurse.get(`/api/triage?q=${clinicNumber}&status=open`)
  expect(queue.status).toBe(200)
  for (const row of queue.body.items as { id: number }[]) {
    const detail = await nurse.get(`/api/triage/${row.id}`)
    if (detail.body.entry?.id === entryId) return detail.body as { id: number }
  }
  throw new Error(`no open item for entry ${entryId}`)
}

describe('phones and the risk profile reach the nurse on the item', () => {
  it('the patient adds his phones, a nurse sets his risk profile, and the item shows both with tel: links; the note is marked read', async () => {
    // The patient keeps his own numbers on his phone-numbers page (in Spanish, his language).
    // The demo record already holds one mobile number; he corrects it and adds his home phone.
    const own = await signInAs(PHONE_PATIENT.email)
    await goTo(own, '/contact')
    await own.getByRole('heading', { level: 1, name: 'Sus números de teléfono' }).waitFor()
    const numbers = own.getByLabel('Número de teléfono')
    await expect.poll(() => numbers.count(), { timeout: 10_000 }).toBe(1)
    await numbers.first().fill('12')
    await own.getByRole('button', { name: 'Guardar', exact: true }).click()
    // Too few digits: said at the field in his language, nothing saved.
    await own.getByText('Escriba un número de teléfono de 7 a 15 dígitos', { exact: false }).waitFor()
    await numbers.first().fill(MOBILE)
    await own.getByRole('button', { name: 'Añadir un número de teléfono' }).click()
    await expect.poll(() => numbers.count(), { timeout: 10_000 }).toBe(2)
    // The new field has the focus, ready to type in.
    await expect(own.evaluate(() => document.activeElement?.getAttribute('type'))).resolves.toBe('tel')
    await numbers.nth(1).fill(HOME)
    await own.getByLabel('Qué tipo de teléfono').nth(1).selectOption('home')
    await own.getByLabel('Mejores horas para llamarle').fill('Por las mañanas, antes de las 11')
    await own.getByRole('radio', { name: 'Por teléfono' }).check()
    await own.getByRole('button', { name: 'Guardar', exact: true }).click()
    await own.getByRole('status').filter({ hasText: 'Sus números de teléfono se han guardado.' }).waitFor()
    expect(await seriousAxeViolations(own)).toEqual([])
    await own.close()

    const patient = await Client.signIn(inject('appUrl'), PHONE_PATIENT.email)
    const patientId = await patientIdOf(patient)
    const stored = await patient.get(`/api/patients/${patientId}/contact`)
    expect(stored.body.phones).toEqual([{ label: 'mobile', number: MOBILE }, { label: 'home', number: HOME }])

    // A nurse ticks two risk factors on his record.
    const page = await signInAs(NURSE)
    await goTo(page, `/staff/patients/${patientId}`)
    const form = page.getByRole('form', { name: 'Risk profile' })
    await form.waitFor()
    await form.getByLabel('Known spinal or vertebral metastases', { exact: true }).check()
    await form.getByLabel('Diabetes', { exact: true }).check()
    await form.getByRole('button', { name: 'Save risk profile' }).click()
    await page.getByRole('status').filter({ hasText: 'Risk profile saved.' }).waitFor()
    expect(await seriousAxeViolations(page)).toEqual([])
    const nurse = await Client.signIn(inject('appUrl'), NURSE)
    const profile = await nurse.get(`/api/patients/${patientId}/risk-profile`)
    expect(profile.body.riskProfile).toMatchObject({ spinalMetastases: true, diabetes: true, heartDisease: false, longQt: false })

    // He sends an entry with only a note: every note is read by a person, so it opens an item.
    const sent = await patient.post(`/api/patients/${patientId}/diary`, diaryEntry({ note: 'Me mareé un poco el martes.' }))
    expect(sent.status).toBe(201)
    const item = await itemOfEntry(nurse, PHONE_PATIENT.clinicNumber, sent.body.id)

    await goTo(page, `/staff/triage/${item.id}`)
    const reach = page.getByRole('region', { name: 'How to reach him' })
    await reach.waitFor()
    // Each number is a link the phone dials, big enough to tap (at least 48 px high).
    const mobile = reach.getByRole('link', { name: `Mobile: ${MOBILE}` })
    await expect(mobile.getAttribute('href')).resolves.toBe('tel:3125550142')
    await expect(reach.getByRole('link', { name: `Home: ${HOME}` }).getAttribute('href')).resolves.toBe('tel:3125550187')
    expect((await mobile.boundingBox())!.height).toBeGreaterThanOrEqual(48)
    await expect(reach.locator('[data-best-times]').textContent()).resolves.toContain('Por las mañanas, antes de las 11')
    await expect(reach.locator('[data-preferred]').textContent()).resolves.toContain('By phone')

    const risk = page.getByRole('region', { name: 'Risk profile' })
    await expect(risk.locator('[data-risk-factor]').evaluateAll(items => items.map(item => item.getAttribute('data-risk-factor'))))
      .resolves.toEqual(['spinalMetastases', 'diabetes'])
    await risk.getByText('Known spinal or vertebral metastases').waitFor()
    await risk.getByText('raises related symptoms one step', { exact: false }).waitFor()
    expect(await seriousAxeViolations(page)).toEqual([])

    // The nurse reads the note and says so; the timeline keeps it in words.
    await page.getByRole('button', { name: 'Mark note as read' }).click()
    await page.getByRole('status').filter({ hasText: 'Note marked as read.' }).waitFor()
    await page.locator('[data-event="note-read"]').getByText('Note read').waitFor()
    await expect.poll(() => page.getByRole('button', { name: 'Mark note as read' }).count(), { timeout: 10_000 }).toBe(0)
    await page.close()
  })
})

describe('a closed emergency reads as the past on the entry page', () => {
  it('an open emergency shows the large Call button; once the nurse closes it, the page says what he reported and what the care team did', async () => {
    const patient = await Client.signIn(inject('appUrl'), OUTCOME_PATIENT.email)
    const patientId = await patientIdOf(patient)
    // A right-now "yes" sent on its own opens the entry (incomplete) and its emergency item.
    const report = await patient.post(`/api/patients/${patientId}/diary/right-now`, { draftId: randomUUID(), items: ['chestPain'] })
    expect(report.status).toBe(201)
    expect(report.body.complete).toBe(false)
    expect(report.body.level).toBe('emergency')
    const entryId = report.body.id as number

    const page = await signInAs(OUTCOME_PATIENT.email)
    await goTo(page, `/diary/${entryId}`)
    const main = page.locator('main')
    await page.getByRole('heading', { level: 1, name: 'Se enviaron sus respuestas de ahora mismo' }).waitFor()
    const call = main.getByRole('link', { name: 'Llamar al 911' })
    await expect(call.getAttribute('href')).resolves.toBe('tel:911')
    expect((await call.boundingBox())!.height).toBeGreaterThanOrEqual(48)
    await main.getByText('Llame ahora al 911. No espere a que la clínica le llame.', { exact: false }).waitFor()
    // Only the right-now check was sent: said plainly, with the way to finish the diary.
    await main.getByText('Solo sus respuestas de la comprobación de ahora mismo llegaron a la clínica.', { exact: false }).waitFor()
    await main.getByRole('link', { name: 'Terminar el diario' }).waitFor()
    // The footer dials the emergency number too.
    await expect(page.locator('footer').getByRole('link', { name: 'Llamar al 911' }).getAttribute('href')).resolves.toBe('tel:911')

    // The nurse sends him to emergency care and closes the item (through the API).
    const nurse = await Client.signIn(inject('appUrl'), NURSE)
    const item = await itemOfEntry(nurse, OUTCOME_PATIENT.clinicNumber, entryId)
    expect((await nurse.post(`/api/triage/${item.id}/events`, { type: 'claim' })).status).toBe(200)
    expect((await nurse.post(`/api/triage/${item.id}/events`, { type: 'disposition', disposition: 'sent-to-emergency' })).status).toBe(200)
    expect((await nurse.post(`/api/triage/${item.id}/events`, { type: 'close' })).status).toBe(200)

    await page.reload()
    const outcome = main.locator('[data-outcome]')
    await outcome.waitFor()
    // Past tense: what he reported on the day, then what the care team did.
    await expect(outcome.textContent()).resolves.toMatch(/El .+ usted informó de:/)
    await outcome.getByText('dolor, opresión o presión en el pecho').waitFor()
    await expect(outcome.locator('[data-outcome-line]').textContent()).resolves.toMatch(/El equipo de atención lo cerró el .+: Enviado a urgencias\./)
    // No more "call now, a nurse has been alerted" for an item the care team has closed.
    await expect.poll(() => main.getByText('También se ha avisado al equipo de enfermería', { exact: false }).count(), { timeout: 10_000 }).toBe(0)
    await expect.poll(() => main.getByRole('alert').count(), { timeout: 10_000 }).toBe(0)
    expect(await seriousAxeViolations(page)).toEqual([])
    await page.close()
  })
})

describe('a caregiver on the entry page and on the item', () => {
  it('she keeps her own phone, reads his entry in words about him, and the nurse can call her from the item', async () => {
    // Dana helps Bernard with view-only access; an item of his is closed again at the end,
    // so the queue test that follows him finds only its own.
    const DANA_PHONE = '(414) 555-0131'
    const patient = await Client.signIn(inject('appUrl'), 'bernard@demo.tidewell.test')
    const patientId = await patientIdOf(patient)
    const nurse = await Client.signIn(inject('appUrl'), NURSE)
    // Blood in the urine is urgent (issue 4 defaults, common practice).
    const sent = await patient.post(`/api/patients/${patientId}/diary`, diaryEntry({ urinary: { blood: true } }))
    expect(sent.status).toBe(201)
    expect(sent.body.level).toBe('urgent')
    const item = await itemOfEntry(nurse, 'LPU-1002', sent.body.id)
    try {
      const dana = await signInAs('dana@demo.tidewell.test')
      await goTo(dana, '/contact')
      await dana.getByRole('heading', { level: 1, name: 'Phone numbers for Bernard Achterberg' }).waitFor()
      await dana.getByRole('region', { name: 'Bernard Achterberg\'s phone numbers' }).getByText('(414) 555-0118').waitFor()
      await dana.getByLabel('Your phone number').fill(DANA_PHONE)
      await dana.getByRole('button', { name: 'Save', exact: true }).click()
      await dana.getByRole('status').filter({ hasText: 'Your phone number is saved.' }).waitFor()

      await goTo(dana, `/diary/${sent.body.id}`)
      const main = dana.locator('main')
      await dana.getByRole('heading', { level: 1, name: 'The diary for Bernard Achterberg was sent' }).waitFor()
      await main.getByText('This is Bernard Achterberg\'s entry. The advice is for him; please help him follow it.').waitFor()
      await main.getByText('A nurse will contact Bernard Achterberg today.').waitFor()
      await main.getByText(/A nurse will call Bernard Achterberg by .+\. Keep the phone close\./).waitFor()
      expect(await seriousAxeViolations(dana)).toEqual([])

      const page = await signInAs(NURSE)
      await goTo(page, `/staff/triage/${item.id}`)
      const reach = page.getByRole('region', { name: 'How to reach him' })
      const call = reach.getByRole('link', { name: `Call Dana Achterberg, caregiver: ${DANA_PHONE}` })
      await expect(call.getAttribute('href')).resolves.toBe('tel:4145550131')
      await page.close()

      // Closed: she reads who sent it and what the care team did, no longer what to do now.
      expect((await nurse.post(`/api/triage/${item.id}/events`, { type: 'disposition', disposition: 'self-care' })).status).toBe(200)
      expect((await nurse.post(`/api/triage/${item.id}/events`, { type: 'close' })).status).toBe(200)
      await dana.reload()
      const outcome = main.locator('[data-outcome]')
      await outcome.getByText(/^On .+ Bernard Achterberg sent this diary entry\.$/).waitFor()
      await expect(outcome.locator('[data-outcome-line]').textContent()).resolves.toMatch(/The care team closed this on .+: Self-care advice given\./)
      await expect.poll(() => main.getByText('Keep the phone close', { exact: false }).count(), { timeout: 10_000 }).toBe(0)
      await dana.close()
    }
    finally {
      // Closed even when a check above failed; a second close of a closed item is refused, which is fine.
      await nurse.post(`/api/triage/${item.id}/events`, { type: 'disposition', disposition: 'self-care' })
      await nurse.post(`/api/triage/${item.id}/events`, { type: 'close' })
    }
  })
})

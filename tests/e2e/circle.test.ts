import type { Page } from 'playwright-core'
import { describe, expect, it } from 'vitest'
import { url, waitForHydration } from '@nuxt/test-utils/e2e'
import { Client } from '../support/client'
import { linkIn } from '../support/mail-catcher'
import { createPage, seriousAxeViolations, setupBrowser, signInAs } from '../support/browser'

await setupBrowser()

// Browser tests share one server: this demo patient and the new caregiver are used by this file only.
const PATIENT = 'howard@demo.tidewell.test'
const HELPER = { name: 'Wilhelmina Tillinghast', email: 'wilhelmina@demo.tidewell.test', password: 'kettle on by the window' }

/** The invitation link from the app's own mail catcher (read as an admin). */
async function invitationLink(email: string): Promise<string> {
  const admin = await Client.signIn(url('/'), 'admin@demo.tidewell.test')
  const deadline = Date.now() + 15_000
  while (Date.now() < deadline) {
    const { messages } = (await admin.get('/api/admin/mail')).body as { messages: { to: string, text: string }[] }
    const found = messages.find(m => m.to.includes(email))
    if (found) return linkIn(found.text)
    await new Promise(r => setTimeout(r, 200))
  }
  throw new Error(`no invitation for ${email}`)
}

async function goTo(page: Page, path: string) {
  await page.goto(url(path))
  await waitForHydration(page, url(path), 'hydration')
}

/** Sends a quiet week through the diary form, leaving the monthly urinary questions for later. */
async function sendQuietDiary(page: Page) {
  await goTo(page, '/diary/new')
  await page.getByText('You are filling in the diary for Howard Tillinghast.').waitFor()
  for (let step = 1; step <= 9; step++) {
    await page.getByText(new RegExp(`^Step ${step} of 10:`)).waitFor()
    if (step === 2) {
      await page.getByLabel('On an average day, how many hot flushes did you have?').fill('2')
      await page.getByRole('group', { name: 'How strong was the worst one?' }).getByRole('radio', { name: 'Mild', exact: true }).check()
      await page.getByRole('group', { name: 'How much did they get in the way?' }).getByRole('radio', { name: /^Not at all/ }).check()
    }
    const leaveIpss = page.getByRole('button', { name: 'Leave these questions for now' })
    if (step === 4 && await leaveIpss.count()) await leaveIpss.click()
    await page.getByRole('button', { name: step === 1 ? 'None of these is happening: next' : 'Next', exact: true }).click()
  }
  await page.getByText('Step 10 of 10: Check your answers').waitFor()
  await page.getByRole('button', { name: 'Send my diary' }).click()
  await page.waitForURL(u => /^\/diary\/\d+$/.test(u.pathname))
}

describe('the care circle', () => {
  it('a patient invites a caregiver, who accepts from the e-mail, logs a diary entry for him, and loses access when removed', async () => {
    // The patient invites her, allowing diary entries but not appointments.
    const patient = await signInAs(PATIENT)
    await patient.getByRole('link', { name: 'Care circle' }).click()
    await patient.getByRole('heading', { level: 1, name: 'Care circle' }).waitFor()
    await waitForHydration(patient, url('/circle'), 'hydration')
    await patient.getByText('Nobody is in the care circle yet.').waitFor()
    expect(await seriousAxeViolations(patient)).toEqual([])
    await patient.getByLabel('Their full name').fill(HELPER.name)
    await patient.getByLabel('Their e-mail address').fill(HELPER.email)
    await patient.getByLabel('Log diary entries').check()
    await patient.getByRole('button', { name: 'Send invitation' }).click()
    await patient.getByText(`Invitation sent to ${HELPER.email}.`).waitFor()
    await patient.getByRole('heading', { name: 'Invitations not yet accepted' }).waitFor()

    // She follows the link from the e-mail and chooses a password.
    const link = new URL(await invitationLink(HELPER.email))
    expect(link.pathname).toBe('/circle/accept')
    const helper = await createPage(`${link.pathname}${link.search}`)
    await waitForHydration(helper, url(`${link.pathname}${link.search}`), 'hydration')
    await helper.getByText('Howard Tillinghast invited you to his care circle in Tidewell.').waitFor()
    const offered = helper.getByRole('listitem')
    await expect(offered.allTextContents()).resolves.toEqual(expect.arrayContaining([
      expect.stringContaining('See the schedule, diary and results'),
      expect.stringContaining('Log diary entries'),
    ]))
    await expect(helper.getByText('Confirm or change appointments').count()).resolves.toBe(0)
    expect(await seriousAxeViolations(helper)).toEqual([])
    await expect(helper.getByLabel('Your full name').inputValue()).resolves.toBe(HELPER.name)
    await helper.getByLabel('New password', { exact: true }).fill(HELPER.password)
    await helper.getByLabel('Type the new password again').fill(HELPER.password)
    await helper.getByRole('button', { name: 'Create my account and accept' }).click()
    await helper.waitForURL(u => u.pathname === '/today')
    const banner = helper.getByTestId('helping-banner')
    await banner.getByText('You are helping: Howard Tillinghast').waitFor()
    await expect(banner.textContent()).resolves.toContain('Log diary entries')
    expect(await seriousAxeViolations(helper)).toEqual([])

    // She logs this week's diary on his behalf.
    await sendQuietDiary(helper)
    await helper.getByText('You are helping: Howard Tillinghast').waitFor()

    // He sees the entry, with her name on it.
    await goTo(patient, '/diary')
    await patient.getByText(`Entered by ${HELPER.name} (caregiver)`).waitFor()

    // He removes her from the circle.
    await goTo(patient, '/circle')
    const member = patient.getByTestId(`circle-member-${HELPER.email}`)
    await member.getByText('Added on').waitFor()
    await member.getByRole('button', { name: `Remove ${HELPER.name}` }).click()
    await member.getByText(`Remove ${HELPER.name} from the care circle?`).waitFor()
    await member.getByRole('button', { name: 'Yes, remove' }).click()
    await patient.getByText(`${HELPER.name} was removed from the care circle.`).waitFor()
    await patient.getByText('Nobody is in the care circle yet.').waitFor()

    // Her very next page shows no access, and the record answers "not found".
    await goTo(helper, '/today')
    await helper.getByText('You are not helping anyone right now.', { exact: false }).waitFor()
    await expect(helper.getByText('You are helping: Howard Tillinghast').count()).resolves.toBe(0)
    const patientId = (await (await Client.signIn(url('/'), PATIENT)).get('/api/_auth/session')).body.user.patientId as number
    expect((await helper.request.get(url(`/api/patients/${patientId}/diary`))).status()).toBe(404)

    // His access history names her: she opened and changed his record.
    await goTo(patient, '/access-history')
    await expect(patient.getByTestId('access-history-item').filter({ hasText: HELPER.name }).count()).resolves.toBeGreaterThan(1)
    await patient.getByText('Logged a diary entry').first().waitFor()
    expect(await seriousAxeViolations(patient)).toEqual([])
    await helper.close()
    await patient.close()
  })

  it('an admin filters the audit trail by patient and downloads it', async () => {
    const page = await signInAs('admin@demo.tidewell.test')
    await page.getByRole('link', { name: 'Audit trail' }).click()
    await page.getByRole('heading', { level: 1, name: 'Audit trail' }).waitFor()
    await waitForHydration(page, url('/admin/audit'), 'hydration')
    await page.getByLabel('Patient').selectOption({ label: 'Howard Tillinghast · LPU-1011' })
    await page.getByLabel('Person').selectOption({ label: `${HELPER.name} (Caregiver)` })
    await page.getByRole('button', { name: 'Show events' }).click()
    await page.waitForURL(u => u.searchParams.has('patient') && u.searchParams.has('actor'))
    const rows = page.getByTestId('audit-row')
    await rows.first().waitFor()
    await expect(rows.filter({ hasText: 'Refused' }).count()).resolves.toBeGreaterThan(0)
    await expect(rows.filter({ hasText: 'Logged a diary entry' }).count()).resolves.toBe(1)
    expect(await seriousAxeViolations(page)).toEqual([])

    const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('link', { name: 'Download as CSV' }).click()])
    expect(download.suggestedFilename()).toMatch(/^tidewell-audit-trail-\d{4}-\d{2}-\d{2}\.csv$/)
    await page.close()
  })
})

import type { Page } from 'playwright-core'
import { describe, expect, it } from 'vitest'
import { url, waitForHydration } from '@nuxt/test-utils/e2e'
import { Client } from '../support/client'
import { sentInvitationLinks } from '../support/circle'
import { createPage, seriousAxeViolations, setupBrowser, signInAs } from '../support/browser'

await setupBrowser()

// Browser tests share one server: this demo patient and the new caregiver are used by this file only.
const PATIENT = 'howard@demo.tidewell.test'
const HELPER = { name: 'Wilhelmina Tillinghast', email: 'wilhelmina@demo.tidewell.test', password: 'kettle on by the window' }

async function goTo(page: Page, path: string) {
  await page.goto(url(path))
  await waitForHydration(page, url(path), 'hydration')
}

/** Sends a quiet week through the diary form, leaving the monthly urinary questions for later. */
async function sendQuietDiary(page: Page) {
  await goTo(page, '/diary/new')
  await page.getByText('You are answering for Howard Tillinghast, as best you can.').waitFor()
  for (let step = 1; step <= 10; step++) {
    await page.getByText(new RegExp(`^Step ${step} of 11:`)).waitFor()
    // The right-now questions start unanswered: "None of these is happening" answers them no.
    if (step === 1) await page.getByRole('button', { name: 'None of these is happening', exact: true }).click()
    if (step === 2) {
      await page.getByLabel('How many hot flushes on an average day?').fill('2')
      await page.getByRole('group', { name: 'How strong was the worst one?' }).getByRole('radio', { name: 'Mild', exact: true }).check()
      await page.getByRole('group', { name: 'How much did they get in the way?' }).getByRole('radio', { name: /^Not at all/ }).check()
    }
    const leaveIpss = page.getByRole('button', { name: 'Leave these questions for now' })
    if (step === 4 && await leaveIpss.count()) await leaveIpss.click()
    await page.getByRole('button', { name: 'Next', exact: true }).click()
  }
  await page.getByText('Step 11 of 11: Check your answers').waitFor()
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
    const link = new URL((await sentInvitationLinks(url('/'), HELPER.email, 1))[0]!)
    expect(link.pathname).toBe('/circle/accept')
    const helper = await createPage(`${link.pathname}${link.search}`)
    await waitForHydration(helper, url(`${link.pathname}${link.search}`), 'hydration')
    await helper.getByText('Howard Tillinghast invited you to his care circle in Tidewell.').waitFor()
    const offered = helper.getByRole('listitem')
    await expect(offered.allTextContents()).resolves.toEqual(expect.arrayContaining([
      expect.stringContaining('See the schedule, diary and results'),
      expect.stringContaining('Log diary entries'),
    ]))
    await expect.poll(() => helper.getByText('Confirm or change appointments').count(), { timeout: 10_000 }).toBe(0)
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
    await expect.poll(() => helper.getByText('You are helping: Howard Tillinghast').count(), { timeout: 10_000 }).toBe(0)
    const patientId = (await (await Client.signIn(url('/'), PATIENT)).get('/api/_auth/session')).body.user.patientId as number
    expect((await helper.request.get(url(`/api/patients/${patientId}/diary`))).status()).toBe(404)

    // His access history names her: she opened and changed his record.
    await goTo(patient, '/access-history')
    await expect.poll(() => patient.getByTestId('access-history-item').filter({ hasText: HELPER.name }).count(), { timeout: 10_000 }).toBeGreaterThan(1)
    await patient.getByText('Logged a diary entry').first().waitFor()
    expect(await seriousAxeViolations(patient)).toEqual([])
    await helper.close()
    await patient.close()
  })

  it('a caregiver who already has an account signs in to accept, then switches between the two men she helps', async () => {
    const theodora = { name: 'Theodora Hathersage', email: 'theodora@demo.tidewell.test', password: 'morning fog on the estuary' }
    for (const [email, clinicNumber] of [['cyril@demo.tidewell.test', 'LPU-1008'], ['kenji@demo.tidewell.test', 'LPU-1006']] as const) {
      const patient = await Client.signIn(url('/'), email)
      const patientId = (await patient.get('/api/_auth/session')).body.user.patientId as number
      const sent = await patient.post(`/api/patients/${patientId}/circle`, { name: theodora.name, email: theodora.email, canLogDiary: false, canManageAppointments: clinicNumber === 'LPU-1006' })
      expect(sent.status).toBe(201)
    }
    // The e-mails name nobody but her, so the page tells which man each link is from.
    const [firstLink, secondLink] = await sentInvitationLinks(url('/'), theodora.email, 2)

    // The first link makes her account.
    const first = new URL(firstLink!)
    const page = await createPage(`${first.pathname}${first.search}`)
    await waitForHydration(page, url(`${first.pathname}${first.search}`), 'hydration')
    const inviter = await page.getByText(/invited you to his care circle/).textContent()
    const firstName = inviter!.includes('Cyril') ? 'Cyril Hathersage' : 'Kenji Arakawa-Dunn'
    const secondName = firstName === 'Cyril Hathersage' ? 'Kenji Arakawa-Dunn' : 'Cyril Hathersage'
    await page.getByLabel('New password', { exact: true }).fill(theodora.password)
    await page.getByLabel('Type the new password again').fill(theodora.password)
    await page.getByRole('button', { name: 'Create my account and accept' }).click()
    await page.getByText(`You are helping: ${firstName}`).waitFor()
    await page.close()

    // The second, opened signed out: she signs in first, then adds him to her list.
    const second = new URL(secondLink!)
    const other = await createPage(`${second.pathname}${second.search}`)
    await waitForHydration(other, url(`${second.pathname}${second.search}`), 'hydration')
    await other.getByText(`You already have a Tidewell account (${theodora.email}).`, { exact: false }).waitFor()
    await other.getByRole('link', { name: 'Sign in to accept' }).click()
    await other.waitForURL(u => u.pathname === '/sign-in')
    await waitForHydration(other, other.url(), 'hydration')
    await other.getByLabel(/e-mail/i).fill(theodora.email)
    await other.getByLabel(/^password$/i).fill(theodora.password)
    await other.getByRole('button', { name: /^sign in$/i }).click()
    await other.waitForURL(u => u.pathname === '/circle/accept')
    await other.getByRole('button', { name: `Add ${secondName} to my list` }).click()
    await other.waitForURL(u => u.pathname === '/today')
    const banner = other.getByTestId('helping-banner')
    await banner.getByText(`You are helping: ${secondName}`).waitFor()

    // The switch says whose record is open after every change.
    // Kenji let her manage appointments, Cyril did not; the banner says what she may do for whom.
    const mayManage = (name: string) => name.startsWith('Kenji')
    for (const name of [firstName, secondName]) {
      await banner.getByRole('button', { name: `Switch to ${name}` }).click()
      await banner.getByText(`You are helping: ${name}`).waitFor()
      expect((await banner.textContent())!.includes('Confirm or change appointments'), name).toBe(mayManage(name))
    }
    await other.reload()
    await other.getByText(`You are helping: ${secondName}`).waitFor()
    expect(await seriousAxeViolations(other)).toEqual([])
    await other.close()
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
    await expect.poll(() => rows.filter({ hasText: 'Refused' }).count(), { timeout: 10_000 }).toBeGreaterThan(0)
    await expect.poll(() => rows.filter({ hasText: 'Logged a diary entry' }).count(), { timeout: 10_000 }).toBe(1)
    expect(await seriousAxeViolations(page)).toEqual([])

    const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('link', { name: 'Download as CSV' }).click()])
    expect(download.suggestedFilename()).toMatch(/^tidewell-audit-trail-\d{4}-\d{2}-\d{2}\.csv$/)
    await page.close()
  })
})

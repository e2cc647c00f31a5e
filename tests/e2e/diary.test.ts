import type { Page, Route } from 'playwright-core'
import { describe, expect, inject, it } from 'vitest'
import { url, waitForHydration } from '@nuxt/test-utils/e2e'
import { seriousAxeViolations, setupBrowser, signInAs } from '../support/browser'
import { Client } from '../support/client'

await setupBrowser()

// Browser tests share one server: these demo patients are used by this file only.
const ROUTINE_PATIENT = 'franklin@demo.tidewell.test'
const EMERGENCY_PATIENT = 'desmond@demo.tidewell.test'
const EMERGENCY_CLINIC_NUMBER = 'LPU-1009'
const CLOSES_THE_PAGE = 'odell@demo.tidewell.test'
const CLOSES_THE_PAGE_CLINIC_NUMBER = 'LPU-1004'
const NURSE = 'nurse@demo.tidewell.test'
const STEPS = 11
const MIDDLE_STEPS = [[5, 'Heart and circulation'], [6, 'Blood sugar'], [7, 'Other changes'], [8, 'Mood and tiredness'], [9, 'Injection site']] as const

async function openDiary(page: Page) {
  await page.goto(url('/diary/new'))
  await waitForHydration(page, url('/diary/new'), 'hydration')
  await page.getByRole('heading', { level: 1, name: 'Weekly diary' }).waitFor()
}

async function atStep(page: Page, step: number, title: string) {
  await page.getByText(`Step ${step} of ${STEPS}: ${title}`).waitFor()
  await page.getByRole('heading', { level: 2, name: title }).waitFor()
}

function question(page: Page, name: string | RegExp) {
  return page.getByRole('group', { name })
}

async function choose(page: Page, group: string | RegExp, answer: string | RegExp) {
  await question(page, group).getByRole('radio', { name: answer, exact: typeof answer === 'string' }).check()
}

async function next(page: Page) {
  await page.getByRole('button', { name: 'Next', exact: true }).click()
}

/** Answers "no" to every right-now question still open, in one act, then goes on. */
async function noneOfThese(page: Page) {
  await page.getByRole('button', { name: 'None of these is happening', exact: true }).click()
  await expect.poll(() => page.getByRole('button', { name: 'Next', exact: true }).getAttribute('aria-disabled'), { timeout: 10_000 }).toBe(null)
  await next(page)
}

/** The open triage queue items of one patient, as a nurse sees them through the API. */
async function queueOf(clinicNumber: string) {
  const nurse = await Client.signIn(inject('appUrl'), NURSE)
  const reply = await nurse.get(`/api/triage?q=${clinicNumber}`)
  expect(reply.status).toBe(200)
  return reply.body.items as { level: string, clinicNumber: string }[]
}

describe('the weekly diary', () => {
  it('a patient with mild symptoms fills the diary step by step and sees "Routine"', async () => {
    const page = await signInAs(ROUTINE_PATIENT)
    await openDiary(page)
    expect(await seriousAxeViolations(page)).toEqual([])

    // Every right-now question starts unanswered, and "Next" waits until each has an answer.
    await atStep(page, 1, 'Right-now check')
    const forward = page.getByRole('button', { name: 'Next', exact: true })
    await expect(forward.getAttribute('aria-disabled')).resolves.toBe('true')
    await page.getByText('11 questions above still have no answer.').waitFor()
    await expect(question(page, 'Is it hard to breathe?').getByRole('radio', { name: 'No', exact: true }).isChecked()).resolves.toBe(false)
    // Playwright will not click an aria-disabled button; a tap does nothing but lead to the first open question.
    await forward.click({ force: true })
    await expect.poll(() => page.evaluate(() => document.activeElement?.closest('fieldset')?.id), { timeout: 10_000 }).toBe('diary-rightNow-newWeakness')
    await expect.poll(() => page.getByText(`Step 1 of ${STEPS}: Right-now check`).count(), { timeout: 10_000 }).toBe(1)
    await expect.poll(() => page.getByText(`Step 2 of ${STEPS}:`).count()).toBe(0)
    await choose(page, 'Is it hard to breathe?', 'No')
    await page.getByText('10 questions above still have no answer.', { exact: true }).waitFor()
    await expect(forward.getAttribute('aria-disabled')).resolves.toBe('true')
    await noneOfThese(page)

    // Hot flushes: a bad number is refused at the field and the step does not move on.
    await atStep(page, 2, 'Hot flushes')
    const perDay = page.getByLabel('How many hot flushes on an average day?')
    await perDay.fill('lots')
    await next(page)
    await page.getByText('Enter a whole number from 0 to 50.').waitFor()
    await expect.poll(() => page.getByText(`Step 2 of ${STEPS}: Hot flushes`).count(), { timeout: 10_000 }).toBe(1)
    await perDay.fill('4')
    await choose(page, 'How strong was the worst one?', 'Moderate')
    // Moderate flushes that limit usual activities: CTCAE v5.0 hot flashes grade 2 -> routine.
    await choose(page, 'How much did they get in the way?', /usual activities/)
    await next(page)

    await atStep(page, 3, 'Pain')
    await choose(page, 'What was your worst pain this past week?', '2')
    await next(page)

    // No IPSS in the last 28 days, so the monthly questions are open; they must be answered.
    await atStep(page, 4, 'Passing urine')
    await next(page)
    await expect.poll(() => page.getByText('Choose an answer from 0 to 5.').count()).toBe(7)
    const howOften = question(page, /^Over the past month, how often/)
    await expect.poll(() => howOften.count(), { timeout: 10_000 }).toBe(6)
    for (const group of await howOften.all()) await group.getByRole('radio', { name: 'Not at all' }).check()
    await choose(page, /how many times did you usually get up/, 'None')
    await choose(page, /rest of your life/, 'Pleased')
    await next(page)

    for (const [step, title] of MIDDLE_STEPS) {
      await atStep(page, step, title)
      await next(page)
    }

    await atStep(page, 10, 'Anything else')
    await page.getByLabel('Anything else the clinic should know?').fill('Sleeping a little better this week.')
    await page.getByText('35 of 2,000 characters').waitFor()
    // The note says when it is read: the clinic's routine response time when /api/clinic gives
    // it (default 3 working days, server/utils/core/settings.ts), otherwise "a few working days".
    const clinic = await (await fetch(new URL('/api/clinic', inject('appUrl')))).json() as { routineResponseWorkingDays?: number }
    await page.getByText(clinic.routineResponseWorkingDays === undefined
      ? 'A nurse reads every note within a few working days.'
      : `A nurse reads every note within ${clinic.routineResponseWorkingDays} working days.`, { exact: false }).waitFor()
    await page.getByText('Danger signs do not go in a note: answer them in the right-now check, or call', { exact: false }).waitFor()
    await next(page)

    await atStep(page, 11, 'Check your answers')
    await page.getByText('They got in the way of my usual activities (shopping, cooking, going out)').waitFor()
    await page.getByRole('button', { name: 'Send my diary' }).click()

    await page.waitForURL(u => /^\/diary\/\d+$/.test(u.pathname))
    await page.getByRole('heading', { level: 1, name: 'Your diary was sent' }).waitFor()
    await page.getByText('The clinic will be in touch', { exact: true }).waitFor()
    await page.getByText(/The nurse will talk with you about ways to ease your hot flushes/).waitFor()
    await page.getByText(/A nurse will be in touch by/).waitFor()
    await page.getByText('Tidewell does not replace medical advice. If you are worried, call your clinic.').first().waitFor()
    expect(await seriousAxeViolations(page)).toEqual([])

    // The history lists it, and the table beside the chart holds the score: 4 a day at
    // moderate (weight 2) = 8 (Sloan JA et al., J Clin Oncol 2001; weights from memory).
    await page.getByRole('link', { name: 'See all diary entries' }).click()
    await page.getByRole('heading', { level: 1, name: 'Your diary' }).waitFor()
    const table = page.getByRole('table', { name: 'Hot-flush score for each entry' })
    await expect(table.getByRole('cell').last().textContent()).resolves.toBe('8')
    await page.getByText('Entered by Franklin Osei-Mensah').waitFor()
    await page.getByRole('link', { name: 'Fill in this week\'s diary' }).waitFor()
    expect(await seriousAxeViolations(page)).toEqual([])
    await page.close()
  })

  it('Today then shows the last entry and its level, with the way to the next one', async () => {
    const page = await signInAs(ROUTINE_PATIENT)
    const card = page.getByRole('region', { name: 'Weekly diary' })
    await card.waitFor()
    await card.getByText(/^Last diary entry: /).waitFor()
    await expect.poll(() => card.getByText('The clinic will be in touch', { exact: true }).count(), { timeout: 10_000 }).toBe(1)
    await expect.poll(() => card.getByText(/Your weekly diary is due/).count(), { timeout: 10_000 }).toBe(0)
    await card.getByRole('link', { name: 'Fill in this week\'s diary' }).waitFor()
    await page.close()
  })

  it('a "yes" to new weakness shows the emergency screen and is sent at once; the rest of the diary joins the same entry and queue item', async () => {
    const page = await signInAs(EMERGENCY_PATIENT)
    await openDiary(page)
    await atStep(page, 1, 'Right-now check')
    await choose(page, 'Do you have new weakness in your legs or arms?', 'Yes')

    const alert = page.getByRole('alert').filter({ hasText: 'Get help now' })
    await alert.waitFor()
    await expect(alert.textContent()).resolves.toContain('Call 911 now. Do not wait for a reply from the clinic.')
    const screen = page.getByRole('region', { name: 'Get help now' })
    await expect(screen.textContent()).resolves.toContain('Say that you have prostate cancer and new weakness in your legs or arms.')
    // Still on the right-now check, with the instructions above the form.
    await expect.poll(() => page.getByLabel('How many hot flushes on an average day?').count(), { timeout: 10_000 }).toBe(0)
    const alertTop = (await alert.boundingBox())!.y
    const formTop = (await page.locator('#diary-form').boundingBox())!.y
    expect(alertTop).toBeLessThan(formTop)
    // A large button that dials the emergency number (at least 48 px high).
    const call = screen.getByRole('link', { name: 'Call 911', exact: true })
    await expect(call.getAttribute('href')).resolves.toBe('tel:911')
    expect((await call.boundingBox())!.height).toBeGreaterThanOrEqual(48)
    // Sent on its own, before the rest of the diary.
    await page.getByText(/^Sent to the care team at \d{1,2}:\d{2}\s?[AP]M; a nurse has been alerted\.$/).waitFor()
    expect(await seriousAxeViolations(page)).toEqual([])
    await expect.poll(async () => (await queueOf(EMERGENCY_CLINIC_NUMBER)).map(item => item.level), { timeout: 10_000 }).toEqual(['emergency'])

    // The yes that was sent cannot quietly become a no.
    const weakness = question(page, 'Do you have new weakness in your legs or arms?')
    await expect(weakness.getByRole('radio', { name: 'No', exact: true }).isDisabled()).resolves.toBe(true)
    await weakness.getByText(/It cannot be taken back here/).waitFor()

    // "Continue my diary" waits for the other questions too.
    const forward = page.getByRole('button', { name: 'Continue my diary' })
    await expect(forward.getAttribute('aria-disabled')).resolves.toBe('true')
    await page.getByRole('button', { name: 'None of these is happening', exact: true }).click()
    await expect.poll(() => forward.getAttribute('aria-disabled'), { timeout: 10_000 }).toBe(null)
    await forward.click()
    await atStep(page, 2, 'Hot flushes')
    await expect.poll(() => page.getByRole('alert').filter({ hasText: 'Call 911 now.' }).count(), { timeout: 10_000 }).toBe(1)
    for (const [step, title] of [[2, 'Hot flushes'], [3, 'Pain'], [4, 'Passing urine']] as const) {
      await atStep(page, step, title)
      if (step === 4) await page.getByRole('button', { name: 'Leave these questions for now' }).click()
      await next(page)
    }
    for (const [step, title] of [...MIDDLE_STEPS, [10, 'Anything else']] as const) {
      await atStep(page, step, title)
      await next(page)
    }
    await atStep(page, 11, 'Check your answers')
    await page.getByRole('button', { name: 'Send my diary' }).click()

    await page.waitForURL(u => /^\/diary\/\d+$/.test(u.pathname))
    await page.getByText('Call for help now', { exact: true }).first().waitFor()
    // One entry, one queue item.
    await expect.poll(async () => (await queueOf(EMERGENCY_CLINIC_NUMBER)).length, { timeout: 10_000 }).toBe(1)
    await page.close()
  })

  it('a field message from the server is shown at the field, with nothing lost', async () => {
    const page = await signInAs(EMERGENCY_PATIENT)
    // Stand in for a server that refuses an answer the page let through.
    await page.route('**/api/patients/*/diary', route => route.request().method() === 'POST'
      ? route.fulfill({
          status: 400,
          contentType: 'application/json',
          body: JSON.stringify({ statusCode: 400, message: 'errors.invalidInput', data: { fieldErrors: { 'pain.worst': ['validation.diary.painRange'] } } }),
        })
      : route.continue())
    await openDiary(page)
    for (let step = 1; step <= 10; step++) {
      await page.getByText(new RegExp(`^Step ${step} of ${STEPS}:`)).waitFor()
      if (step === 1) {
        await noneOfThese(page)
        continue
      }
      if (step === 3) await choose(page, 'What was your worst pain this past week?', '4')
      // Later steps load their code when first reached: wait for the questions before looking for the button.
      await page.locator('#diary-form :is(fieldset, textarea)').first().waitFor()
      const leaveIpss = page.getByRole('button', { name: 'Leave these questions for now' })
      if (step === 4 && await leaveIpss.count()) await leaveIpss.click()
      await next(page)
    }
    await atStep(page, 11, 'Check your answers')
    await page.getByRole('button', { name: 'Send my diary' }).click()

    await atStep(page, 3, 'Pain')
    await page.getByText('Some answers need another look. See the messages below.').waitFor()
    const worst = question(page, 'What was your worst pain this past week?')
    await expect.poll(() => worst.getByText('Choose a whole number from 0 (no pain) to 10 (worst pain you can imagine).').count(), { timeout: 10_000 }).toBe(1)
    await expect(worst.getByRole('radio', { name: '4', exact: true }).isChecked()).resolves.toBe(true)
    await page.getByRole('button', { name: 'Back to checking my answers' }).click()
    await atStep(page, 11, 'Check your answers')
    await page.getByText('4 of 10', { exact: true }).waitFor()
    await page.close()
  })

  it('a reload keeps the draft and the step', async () => {
    const page = await signInAs(EMERGENCY_PATIENT)
    await openDiary(page)
    await atStep(page, 1, 'Right-now check')
    await noneOfThese(page)
    await atStep(page, 2, 'Hot flushes')
    await page.getByLabel('How many hot flushes on an average day?').fill('6')
    await choose(page, 'How strong was the worst one?', 'Severe')
    await next(page)
    await atStep(page, 3, 'Pain')
    await choose(page, 'What was your worst pain this past week?', '3')

    await page.reload()
    await waitForHydration(page, url('/diary/new'), 'hydration')
    await atStep(page, 3, 'Pain')
    await expect(question(page, 'What was your worst pain this past week?').getByRole('radio', { name: '3', exact: true }).isChecked()).resolves.toBe(true)
    await page.getByRole('button', { name: 'Back' }).click()
    await atStep(page, 2, 'Hot flushes')
    await expect(page.getByLabel('How many hot flushes on an average day?').inputValue()).resolves.toBe('6')
    await expect(question(page, 'How strong was the worst one?').getByRole('radio', { name: 'Severe', exact: true }).isChecked()).resolves.toBe(true)
    await page.close()
  })
  it('a "yes" on step 1 reaches the nurses\' queue when he closes the page at once, also after a failed send', async () => {
    const page = await signInAs(CLOSES_THE_PAGE)
    await openDiary(page)
    await atStep(page, 1, 'Right-now check')
    // No connection: the screen says so, keeps telling him to call, and tries again.
    await page.context().setOffline(true)
    await choose(page, 'Do you have chest pain, tightness or pressure?', 'Yes')
    const alert = page.getByRole('alert').filter({ hasText: 'Get help now' })
    await alert.waitFor()
    await page.getByText(/^Not sent yet: .*Do not wait for it: call 911 now\.$/).waitFor()
    await page.getByRole('region', { name: 'Get help now' }).getByRole('link', { name: 'Call 911', exact: true }).waitFor()
    await page.context().setOffline(false)
    await page.getByText(/^Sent to the care team at .*; a nurse has been alerted\.$/).waitFor()
    await page.close()

    const items = await queueOf(CLOSES_THE_PAGE_CLINIC_NUMBER)
    expect(items.map(item => item.level)).toEqual(['emergency'])
  })

  it('a right-now yes the server refused is still on its way after a reload, and is delivered when the server answers', async () => {
    const page = await signInAs(CLOSES_THE_PAGE)
    // Stand in for a fault at the clinic's server.
    const refuse = (route: Route) => route.fulfill({ status: 503, contentType: 'application/json', body: '{"statusCode":503}' })
    await page.route('**/api/patients/*/diary/right-now', refuse)
    await openDiary(page)
    await choose(page, 'Is it hard to breathe?', 'Yes')
    const notSent = page.getByText(/^Not sent yet: .*call 911 now\.$/)
    await notSent.waitFor()

    await page.reload()
    await waitForHydration(page, url('/diary/new'), 'hydration')
    await notSent.waitFor()
    await expect(question(page, 'Is it hard to breathe?').getByRole('radio', { name: 'Yes', exact: true }).isChecked()).resolves.toBe(true)
    await page.unroute('**/api/patients/*/diary/right-now', refuse)
    // The next try (after a few seconds) reaches the server.
    await page.getByText(/^Sent to the care team at .*; a nurse has been alerted\.$/).waitFor({ timeout: 30_000 })
    await page.close()
    await expect.poll(async () => (await queueOf(CLOSES_THE_PAGE_CLINIC_NUMBER)).map(item => item.level), { timeout: 10_000 }).toEqual(['emergency', 'emergency'])
  })

  it('a new area asks its details only after a yes, and a no clears them', async () => {
    const page = await signInAs(EMERGENCY_PATIENT)
    await openDiary(page)
    await atStep(page, 1, 'Right-now check')
    await noneOfThese(page)
    for (let step = 2; step <= 6; step++) {
      await page.getByText(new RegExp(`^Step ${step} of ${STEPS}:`)).waitFor()
      // Later steps load their code when first reached: wait for the questions before looking for the button.
      await page.locator('#diary-form :is(fieldset, textarea)').first().waitFor()
      const leaveIpss = page.getByRole('button', { name: 'Leave these questions for now' })
      if (step === 4 && await leaveIpss.count()) await leaveIpss.click()
      await next(page)
    }
    await atStep(page, 7, 'Other changes')
    const fall = 'Any falls?'
    const hitHead = 'Did you hit your head, or hurt yourself?'
    await expect(question(page, fall).getByRole('radio', { name: 'No', exact: true }).isChecked()).resolves.toBe(true)
    await expect.poll(() => question(page, hitHead).count()).toBe(0)
    await choose(page, fall, 'Yes')
    await choose(page, hitHead, 'Yes')
    await choose(page, fall, 'No')
    await expect.poll(() => question(page, hitHead).count(), { timeout: 10_000 }).toBe(0)
    await choose(page, fall, 'Yes')
    await expect(question(page, hitHead).getByRole('radio', { name: 'No', exact: true }).isChecked()).resolves.toBe(true)

    // A temperature is optional, and checked against its scale.
    await choose(page, 'Any fever or chills?', 'Yes')
    await choose(page, 'Which scale does your thermometer show?', '°C')
    await page.getByLabel('Your highest temperature (optional)').fill('83')
    await next(page)
    await page.getByText('Enter a number from 34 to 43 °C.').waitFor()
    await page.getByLabel('Your highest temperature (optional)').fill('38,6')
    await next(page)
    await atStep(page, 8, 'Mood and tiredness')
    expect(await seriousAxeViolations(page)).toEqual([])
    await page.close()
  })

  it('a diary with nothing to report still sends, and the phone layout fits 320 px', async () => {
    const page = await signInAs(EMERGENCY_PATIENT)
    await page.setViewportSize({ width: 320, height: 700 })
    await openDiary(page)
    await atStep(page, 1, 'Right-now check')
    await noneOfThese(page)
    for (let step = 2; step <= 10; step++) {
      await page.getByText(new RegExp(`^Step ${step} of ${STEPS}:`)).waitFor()
      // Later steps load their code when first reached: wait for the questions before looking for the button.
      await page.locator('#diary-form :is(fieldset, textarea)').first().waitFor()
      const leaveIpss = page.getByRole('button', { name: 'Leave these questions for now' })
      if (step === 4 && await leaveIpss.count()) await leaveIpss.click()
      // Nothing wider than the screen.
      await expect(page.evaluate(() => document.documentElement.scrollWidth)).resolves.toBeLessThanOrEqual(320)
      await next(page)
    }
    await atStep(page, 11, 'Check your answers')
    await expect(page.evaluate(() => document.documentElement.scrollWidth)).resolves.toBeLessThanOrEqual(320)
    await page.getByRole('button', { name: 'Send my diary' }).click()
    await page.waitForURL(u => /^\/diary\/\d+$/.test(u.pathname))
    await page.getByRole('heading', { level: 1, name: 'Your diary was sent' }).waitFor()
    await page.close()
  })
})

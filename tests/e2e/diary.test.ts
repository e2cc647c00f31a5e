import type { Page } from 'playwright-core'
import { describe, expect, it } from 'vitest'
import { url, waitForHydration } from '@nuxt/test-utils/e2e'
import { seriousAxeViolations, setupBrowser, signInAs } from '../support/browser'

await setupBrowser()

// Browser tests share one server: these demo patients are used by this file only.
const ROUTINE_PATIENT = 'franklin@demo.tidewell.test'
const EMERGENCY_PATIENT = 'desmond@demo.tidewell.test'
const STEPS = 10

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
  // On the right-now check the forward button says "None of these is happening: next".
  await page.getByRole('button', { name: /^(Next|None of these is happening: next)$/ }).click()
}

describe('the weekly diary', () => {
  it('a patient with mild symptoms fills the diary step by step and sees "Routine"', async () => {
    const page = await signInAs(ROUTINE_PATIENT)
    await openDiary(page)
    expect(await seriousAxeViolations(page)).toEqual([])

    await atStep(page, 1, 'Right-now check')
    await page.getByRole('button', { name: 'None of these is happening: next', exact: true }).click()

    // Hot flushes: a bad number is refused at the field and the step does not move on.
    await atStep(page, 2, 'Hot flushes')
    const perDay = page.getByLabel('On an average day, how many hot flushes did you have?')
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

    for (const [step, title] of [[5, 'Heart and circulation'], [6, 'Blood sugar'], [7, 'Mood and tiredness'], [8, 'Injection site']] as const) {
      await atStep(page, step, title)
      await next(page)
    }

    await atStep(page, 9, 'Anything else')
    await page.getByLabel('Is there anything else you want the clinic to know?').fill('Sleeping a little better this week.')
    await page.getByText('35 of 2,000 characters').waitFor()
    await next(page)

    await atStep(page, 10, 'Check your answers')
    await page.getByText('They got in the way of my usual activities, such as shopping, cooking or going out').waitFor()
    await page.getByRole('button', { name: 'Send my diary' }).click()

    await page.waitForURL(u => /^\/diary\/\d+$/.test(u.pathname))
    await page.getByRole('heading', { level: 1, name: 'Your diary was sent' }).waitFor()
    await page.getByText('Routine', { exact: true }).waitFor()
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
    await expect.poll(() => card.getByText('Routine', { exact: true }).count(), { timeout: 10_000 }).toBe(1)
    await expect.poll(() => card.getByText(/Your weekly diary is due/).count(), { timeout: 10_000 }).toBe(0)
    await card.getByRole('link', { name: 'Fill in this week\'s diary' }).waitFor()
    await page.close()
  })

  it('ticking "new weakness in the legs" shows the emergency instructions before the rest, and the entry is still sent', async () => {
    const page = await signInAs(EMERGENCY_PATIENT)
    await openDiary(page)
    await atStep(page, 1, 'Right-now check')
    await choose(page, 'Do you have new weakness in your legs or arms?', 'Yes')

    const alert = page.getByRole('alert').filter({ hasText: 'Get help now' })
    await alert.waitFor()
    await expect(alert.textContent()).resolves.toContain('Call 911 now. Do not wait for a reply from the clinic.')
    await expect(alert.textContent()).resolves.toContain('Say that you have prostate cancer and new weakness in your legs or arms.')
    // Still on the right-now check, with the instructions above the form.
    await expect.poll(() => page.getByLabel('On an average day, how many hot flushes did you have?').count(), { timeout: 10_000 }).toBe(0)
    const alertTop = (await alert.boundingBox())!.y
    const formTop = (await page.locator('#diary-form').boundingBox())!.y
    expect(alertTop).toBeLessThan(formTop)

    await page.getByRole('button', { name: 'Continue my diary' }).click()
    await atStep(page, 2, 'Hot flushes')
    await expect.poll(() => page.getByRole('alert').filter({ hasText: 'Call 911 now.' }).count(), { timeout: 10_000 }).toBe(1)
    for (const [step, title] of [[2, 'Hot flushes'], [3, 'Pain'], [4, 'Passing urine']] as const) {
      await atStep(page, step, title)
      if (step === 4) await page.getByRole('button', { name: 'Leave these questions for now' }).click()
      await next(page)
    }
    for (const [step, title] of [[5, 'Heart and circulation'], [6, 'Blood sugar'], [7, 'Mood and tiredness'], [8, 'Injection site'], [9, 'Anything else']] as const) {
      await atStep(page, step, title)
      await next(page)
    }
    await atStep(page, 10, 'Check your answers')
    await page.getByRole('button', { name: 'Send my diary' }).click()

    await page.waitForURL(u => /^\/diary\/\d+$/.test(u.pathname))
    await page.getByText('Emergency', { exact: true }).waitFor()
    await page.getByText('Call 911 now. Do not wait for the clinic to call you. A nurse has been alerted as well.').waitFor()
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
    for (let step = 1; step <= 9; step++) {
      await page.getByText(new RegExp(`^Step ${step} of ${STEPS}:`)).waitFor()
      if (step === 3) await choose(page, 'What was your worst pain this past week?', '4')
      const leaveIpss = page.getByRole('button', { name: 'Leave these questions for now' })
      if (step === 4 && await leaveIpss.count()) await leaveIpss.click()
      await next(page)
    }
    await atStep(page, 10, 'Check your answers')
    await page.getByRole('button', { name: 'Send my diary' }).click()

    await atStep(page, 3, 'Pain')
    await page.getByText('Some answers need another look. See the messages below.').waitFor()
    const worst = question(page, 'What was your worst pain this past week?')
    await expect.poll(() => worst.getByText('Choose a whole number from 0 (no pain) to 10 (worst pain you can imagine).').count(), { timeout: 10_000 }).toBe(1)
    await expect(worst.getByRole('radio', { name: '4', exact: true }).isChecked()).resolves.toBe(true)
    await page.getByRole('button', { name: 'Back to checking my answers' }).click()
    await atStep(page, 10, 'Check your answers')
    await page.getByText('4 out of 10').waitFor()
    await page.close()
  })

  it('a reload keeps the draft and the step', async () => {
    const page = await signInAs(EMERGENCY_PATIENT)
    await openDiary(page)
    await atStep(page, 1, 'Right-now check')
    await page.getByRole('button', { name: 'None of these is happening: next', exact: true }).click()
    await atStep(page, 2, 'Hot flushes')
    await page.getByLabel('On an average day, how many hot flushes did you have?').fill('6')
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
    await expect(page.getByLabel('On an average day, how many hot flushes did you have?').inputValue()).resolves.toBe('6')
    await expect(question(page, 'How strong was the worst one?').getByRole('radio', { name: 'Severe', exact: true }).isChecked()).resolves.toBe(true)
    await page.close()
  })
})

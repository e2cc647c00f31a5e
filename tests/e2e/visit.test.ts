import { describe, expect, it } from 'vitest'
import { seriousAxeViolations, setupBrowser, signInAs, url } from '../support/browser'

await setupBrowser()

// Browser tests share one server: this one gives Desmond Laurier (LPU-1009) his dose, and opens
// a visit for Odell Pruitt (LPU-1004) that ends without one (his labs and diary, which the other
// browser tests write, do not change; nor does his schedule, as nothing is given). The
// demo books him for this morning, due today on a 1-month depot (last dose 28 days ago,
// server/db/seed/schedule.ts); the other browser tests that use him (diary: an emergency
// entry; sign-in: a wrong password) do not read his schedule.
//
// Expected values come from the sources: the interval of the 1-month depot is 28 days and the
// clinic's window 7 days either side (REFERENCES.md, prescribing information section 2), so the
// next appointment is offered on the new due date, today + 28; the carton label is a GS1
// element string (GS1 General Specifications: AI 01 GTIN-14 with its check digit, AI 10 the
// lot, variable length, ended by the GS character, ASCII 29; AI 17 the expiry as YYMMDD).

const GS = String.fromCharCode(29)
const GTIN = '09506000134352' // check digit 2, worked by hand in tests/unit/gs1.test.ts
const DAY_MS = 86_400_000
const addDays = (date: string, days: number) => new Date(Date.parse(`${date}T00:00:00Z`) + days * DAY_MS).toISOString().slice(0, 10)
const longDate = (date: string) => new Intl.DateTimeFormat('en-US', { year: 'numeric', month: 'long', day: 'numeric', timeZone: 'UTC' }).format(new Date(`${date}T12:00:00Z`))

describe('the injection visit in the browser', () => {
  it('a nurse works through Desmond\'s visit from today\'s list, with the carton scanned; he sees the dose and his next appointment on Today', async () => {
    const nurse = await signInAs('nurse@demo.tidewell.test')
    await nurse.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Visits' }).click()
    await nurse.getByRole('heading', { level: 1, name: 'Today\'s injections' }).waitFor()
    const { today } = await nurse.evaluate(() => fetch('/api/visits/today').then(r => r.json() as Promise<{ today: string }>))
    // The demo's three appointments today, in time order, none started yet.
    for (const clinicNumber of ['LPU-1009', 'LPU-1004', 'LPU-1011']) await nurse.locator(`[data-patient="${clinicNumber}"]`).waitFor()
    const row = nurse.locator('tr', { has: nurse.locator('[data-patient="LPU-1009"]') })
    await expect(row.locator('[data-state]').textContent()).resolves.toContain('Expected')
    expect(await seriousAxeViolations(nurse)).toEqual([])
    await row.getByRole('button', { name: 'Start the visit: Desmond Laurier' }).click()
    await nurse.waitForURL(u => /^\/staff\/patients\/\d+\/visits\/\d+$/.test(u.pathname))
    await nurse.getByRole('heading', { level: 1, name: 'Injection visit: Desmond Laurier' }).waitFor()

    // 1. Before the kit: his name and date of birth to read back, his window, the checks.
    const checks = nurse.locator('form[aria-labelledby="visit-checks-form-heading"]')
    await expect(checks.getByTestId('visit-name').textContent()).resolves.toBe('Desmond Laurier')
    await expect(checks.getByTestId('visit-dob').textContent()).resolves.toBe('May 5, 1957')
    await expect(checks.getByTestId('visit-window').textContent()).resolves.toBe('Due today: inside his window.')
    expect(await seriousAxeViolations(nurse)).toEqual([])
    // Unconfirmed identity is refused at its field.
    await checks.getByRole('button', { name: 'Save the checks' }).click()
    await checks.locator('#visit-identity-error').waitFor()
    await checks.getByLabel('I read his full name and date of birth back to him').check()
    await checks.getByRole('radio', { name: 'No' }).check()
    await checks.getByLabel('I asked him every question in the list above.').check()
    await checks.getByRole('button', { name: 'Save the checks' }).click()
    await nurse.locator('li[data-step="checks"][data-state="done"]').waitFor()

    // 2. The kit: a scanner types the carton's element string (lot before expiry, so the GS
    // ends the lot) and presses Enter; lot, expiry and the product number fill in.
    const expiresOn = addDays(today, 365)
    const kit = nurse.locator('form[aria-labelledby="visit-kit-form-heading"]')
    await kit.getByLabel('Scan the carton').pressSequentially(`]d201${GTIN}10DL-0412${GS}17${expiresOn.slice(2).replaceAll('-', '')}`)
    await kit.getByLabel('Scan the carton').press('Enter')
    await expect(kit.getByLabel('Lot number').inputValue()).resolves.toBe('DL-0412')
    await expect(kit.getByLabel('Expiry date').inputValue()).resolves.toBe(expiresOn)
    await expect(kit.getByTestId('visit-kit-scan-note').textContent()).resolves.toContain(`product ${GTIN}, lot DL-0412`)
    await kit.getByRole('radio', { name: 'Yes: no clumping or caking' }).check()
    await kit.getByRole('radio', { name: 'Yes: clear and colourless' }).check()
    expect(await seriousAxeViolations(nurse)).toEqual([])
    await kit.getByRole('button', { name: 'Save the kit' }).click()
    const kitStep = nurse.locator('li[data-step="kit"][data-state="done"]')
    await expect(kitStep.getByTestId('visit-kit-lot').textContent()).resolves.toBe('DL-0412')

    // 3. Mixed now; 4. given now into the left deltoid, with the three confirmations.
    await nurse.locator('form[aria-labelledby="visit-mix-form-heading"]').getByRole('button', { name: 'Record the mixing' }).click()
    const give = nurse.locator('form[aria-labelledby="visit-give-form-heading"]')
    await give.getByRole('radio', { name: 'Deltoid, left' }).check()
    await give.getByLabel('I checked aspiration before injecting.').check()
    await give.getByLabel('The whole dose of this one kit was given.').check()
    await give.getByLabel('I put the needle and syringe in the sharps container.').check()
    await give.getByRole('button', { name: 'Record the dose given' }).click()
    const given = nurse.locator('li[data-step="give"][data-state="done"]')
    await expect(given.getByTestId('visit-given-site').textContent()).resolves.toBe('Deltoid, left')

    // 5. After: the next window is offered, its date on the new due date (today + 28).
    const after = nurse.locator('form[aria-labelledby="visit-after-form-heading"]')
    await expect(after.getByTestId('visit-next-window').textContent()).resolves.toBe(`His next window: ${longDate(addDays(today, 21))} to ${longDate(addDays(today, 35))} (due ${longDate(addDays(today, 28))}). The date must fall inside it.`)
    await expect(after.getByLabel('Next appointment: date').inputValue()).resolves.toBe(addDays(today, 28))
    await after.getByLabel('Next appointment: time').fill('10:00')
    await after.getByLabel('Observation after the injection').fill('No reaction after 15 minutes.')
    await after.getByRole('button', { name: 'Save and book the next appointment' }).click()
    await nurse.locator('li[data-step="after"][data-state="done"]').getByTestId('appointment-when').waitFor()
    await expect(nurse.getByTestId('visit-outcome').textContent()).resolves.toContain('Injection given at')
    expect(await seriousAxeViolations(nurse)).toEqual([])

    // The day's list now shows him as given, with the summary to open.
    await nurse.goto(url('/staff/visits'))
    await expect(nurse.locator('tr', { has: nurse.locator('[data-patient="LPU-1009"]') }).locator('[data-state]').textContent()).resolves.toContain('Given')
    await nurse.close()

    const desmond = await signInAs('desmond@demo.tidewell.test')
    const card = desmond.locator('section[aria-labelledby="next-injection-heading"]')
    await card.getByText(`${longDate(today)} · Deltoid, left`).waitFor()
    await expect(card.getByTestId('appointment-when').textContent()).resolves.toContain(longDate(addDays(today, 28)))
    await expect(card.getByTestId('appointment-when').textContent()).resolves.toContain('10:00')
    await desmond.close()
  })

  it('an expired kit is refused with the server\'s words; blood on aspiration discards the kit and asks for a new one; he declines and the visit reads as a summary', async () => {
    const nurse = await signInAs('nurse@demo.tidewell.test')
    await nurse.goto(url('/staff/visits'))
    const { today } = await nurse.evaluate(() => fetch('/api/visits/today').then(r => r.json() as Promise<{ today: string }>))
    await nurse.getByRole('button', { name: 'Start the visit: Odell Pruitt' }).click()
    await nurse.getByRole('heading', { level: 1, name: 'Injection visit: Odell Pruitt' }).waitFor()
    // 6-month depot (168 days), last dose 171 days ago: 3 days past the due date, inside the
    // clinic's 7-day window, so no reason is asked for.
    const checks = nurse.locator('form[aria-labelledby="visit-checks-form-heading"]')
    await expect(checks.getByTestId('visit-window').textContent()).resolves.toBe('Inside his window, 3 days after the due date.')
    await checks.getByLabel('I read his full name and date of birth back to him').check()
    await checks.getByRole('radio', { name: 'No' }).check()
    await checks.getByLabel('I asked him every question in the list above.').check()
    await checks.getByRole('button', { name: 'Save the checks' }).click()

    // Typed by hand, with yesterday's expiry: the server refuses it at the field.
    const kit = nurse.locator('form[aria-labelledby="visit-kit-form-heading"]')
    await kit.getByLabel('Lot number').fill('op-77')
    await kit.getByLabel('Expiry date').fill(addDays(today, -1))
    await kit.getByRole('radio', { name: 'Yes: no clumping or caking' }).check()
    await kit.getByRole('radio', { name: 'Yes: clear and colourless' }).check()
    await kit.getByRole('button', { name: 'Save the kit' }).click()
    await expect(kit.locator('#visit-kit-expiry-error').textContent()).resolves.toContain('This kit is past its expiry date. Do not use it.')
    await kit.getByLabel('Expiry date').fill(addDays(today, 200))
    await kit.getByRole('button', { name: 'Save the kit' }).click()
    await expect(nurse.locator('li[data-step="kit"][data-state="done"]').getByTestId('visit-kit-lot').textContent()).resolves.toBe('OP-77')
    await nurse.locator('form[aria-labelledby="visit-mix-form-heading"]').getByRole('button', { name: 'Record the mixing' }).click()

    // Blood on aspiration: the kit is discarded and the kit step asks for a new one.
    await nurse.locator('form[aria-labelledby="visit-give-form-heading"]').getByRole('button', { name: 'Discard this kit' }).click()
    const discard = nurse.locator('form[aria-labelledby="visit-discard-form-heading"]')
    await discard.getByRole('radio', { name: 'Blood on aspiration' }).check()
    await discard.getByText('prepare a new kit for the whole dose at another site').waitFor()
    await discard.getByRole('button', { name: 'Discard the kit' }).click()
    await nurse.getByRole('heading', { name: 'Prepare a new kit' }).waitFor()
    await nurse.getByText('Wasted (blood on aspiration)').waitFor()
    expect(await seriousAxeViolations(nurse)).toEqual([])

    // He declines a second try today: the visit ends, nothing given, and reads as a summary.
    await nurse.getByRole('button', { name: 'The dose is not given today' }).click()
    const notGiven = nurse.locator('form[aria-labelledby="visit-notGiven-form-heading"]')
    await notGiven.getByRole('radio', { name: 'He declined' }).check()
    await notGiven.getByLabel('Note (optional)').fill('Would rather come back next week.')
    await notGiven.getByRole('button', { name: 'Record: not given today' }).click()
    await expect(nurse.getByTestId('visit-outcome').textContent()).resolves.toContain('Not given today: He declined. His due date does not move. Would rather come back next week.')
    await expect.poll(() => nurse.locator('form').count(), { timeout: 10_000 }).toBe(0)
    expect(await seriousAxeViolations(nurse)).toEqual([])
    await nurse.close()
  })
})

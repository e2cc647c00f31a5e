import type { Browser, Page } from 'playwright-core'
import { chromium } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { RunningApp } from '../support/app'
import { startApp } from '../support/app'
import { CHROMIUM } from '../support/browser'
import { DEMO_PASSWORD } from '../support/client'
import { percentiles, report } from './figures'

/*
 * How long the weekly diary takes a man on a 390 x 844 phone screen, in Chromium, driven as a
 * scripted user. The page's own time (loading, rendering, sending) is measured for real; the
 * man's time is modelled, and every figure of the model is an ASSUMPTION, not a measurement:
 *
 * - reading: 180 words a minute for every word on the step (the questions, hints and answer
 *   labels), slower than the roughly 240 a minute often quoted for adult silent reading (from
 *   memory), because the readers are in their seventies and read on a phone;
 * - each answer he picks (a radio button, a checkbox, "None of these is happening"): 2 s to
 *   decide and tap;
 * - each "Next", "Back" or "Send": 1.5 s to find and tap;
 * - typing: 1.5 characters a second on a phone keyboard;
 * - each figure varies by up to 20 % either way from run to run (a seeded generator), so the
 *   median is over a spread of readers rather than one;
 * - two kinds of reader: the first time he reads every word shown (intros, hints, answer
 *   labels, the review); in a later week he knows the form and reads the questions and his
 *   own answers on the review, and takes in the rest (Yes/No labels, hints, intros) at a
 *   glance, counted as no time.
 *
 * By default the modelled time is added to a clock, not slept, so a run takes seconds; set
 * TIDEWELL_BENCH_REAL_TIME=1 to sleep it for real (each run then takes minutes). The monthly
 * urinary questions (IPSS) are left for another week in both scenarios: they come once in four
 * weeks and add their eight questions when they do. Figures are printed, never asserted.
 */

const RUNS = Number(process.env.TIDEWELL_BENCH_DIARY_RUNS ?? 7)
const REAL_TIME = process.env.TIDEWELL_BENCH_REAL_TIME === '1'
const PATIENT = 'patient@demo.tidewell.test'
const MODEL = { wordsPerMinute: 180, answerMs: 2_000, navigateMs: 1_500, charactersPerSecond: 1.5, spread: 0.2 }

/** A small deterministic generator, so every run of the benchmark models the same readers. */
function random(seed: number) {
  // mulberry32: 32-bit integer steps, so no precision is lost in floating point.
  let state = seed >>> 0
  return () => {
    state = (state + 0x6D2B79F5) >>> 0
    let t = state
    t = Math.imul(t ^ (t >>> 15), t | 1)
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61)
    return ((t ^ (t >>> 14)) >>> 0) / 2 ** 32
  }
}

/** One scripted reader: his pace, and the time he has spent so far (real page time plus modelled human time). */
class Reader {
  humanMs = 0
  /** Words on the current step he has read already (a detail opened after a yes adds only its own). */
  private wordsRead = 0
  /** Words read on each step, for the report. */
  readonly wordsByStep: number[] = []
  private step = 0
  private readonly pace: number

  constructor(readonly page: Page, next: () => number, readonly returning: boolean) {
    this.pace = 1 + (next() * 2 - 1) * MODEL.spread
  }

  private async spend(ms: number) {
    const time = ms * this.pace
    this.humanMs += time
    if (REAL_TIME) await new Promise(resolve => setTimeout(resolve, time))
  }

  /** Reads every word of the step as shown that he has not read yet (the emergency screen too, when there is one). */
  async readStep() {
    const texts = this.returning
      ? await this.page.locator('main').locator('legend, label.tw-label, h2, h3, dd, [role="alert"]').allInnerTexts()
      : [await this.page.locator('main').evaluate(main => {
          // Words only for screen readers (class sr-only, such as "Change: Pain") are not shown, so he does not read them.
          const hidden = [...main.querySelectorAll<HTMLElement>('.sr-only')]
          const saved = hidden.map(element => element.style.display)
          hidden.forEach((element) => { element.style.display = 'none' })
          const text = (main as HTMLElement).innerText
          hidden.forEach((element, index) => { element.style.display = saved[index]! })
          return text
        })]
    const words = texts.join(' ').split(/\s+/).filter(Boolean).length
    await this.spend(Math.max(0, words - this.wordsRead) / MODEL.wordsPerMinute * 60_000)
    this.wordsRead = Math.max(words, this.wordsRead)
    this.wordsByStep[this.step - 1] = this.wordsRead
  }

  async answer(group: string, option: string) {
    await this.spend(MODEL.answerMs)
    await this.page.getByRole('group', { name: group, exact: true }).getByRole('radio', { name: option, exact: true }).check()
  }

  async tick(group: string, option: string) {
    await this.spend(MODEL.answerMs)
    await this.page.getByRole('group', { name: group, exact: true }).getByRole('checkbox', { name: option, exact: true }).check()
  }

  async type(label: string, text: string) {
    await this.spend(text.length / MODEL.charactersPerSecond * 1_000)
    await this.page.getByLabel(label, { exact: true }).fill(text)
  }

  async tap(name: string) {
    await this.spend(MODEL.navigateMs)
    await this.page.getByRole('button', { name, exact: true }).click()
  }

  async choose(name: string) {
    await this.spend(MODEL.answerMs)
    await this.page.getByRole('button', { name, exact: true }).click()
  }

  async atStep(step: number) {
    await this.page.getByText(new RegExp(`^Step ${step} of \\d+:`)).waitFor()
    this.wordsRead = 0
    this.step = step
  }
}

type Scenario = (reader: Reader) => Promise<void>

/** Steps 2 to 10 with what he does on each; a step not listed is read and passed with "Next". */
async function walk(reader: Reader, actions: Partial<Record<number, () => Promise<void>>>) {
  await reader.atStep(1)
  await reader.readStep()
  await (actions[1] ?? (() => reader.choose('None of these is happening')))()
  await reader.tap('Next')
  for (let step = 2; step <= 10; step++) {
    await reader.atStep(step)
    if (step === 4 && await reader.page.getByRole('button', { name: 'Leave these questions for now' }).count()) {
      await reader.choose('Leave these questions for now')
    }
    await reader.readStep()
    await actions[step]?.()
    await reader.tap('Next')
  }
  await reader.atStep(11)
  await reader.readStep()
  await reader.tap('Send my diary')
  await reader.page.waitForURL(u => /^\/diary\/\d+$/.test(u.pathname))
}

const nothingToReport: Scenario = reader => walk(reader, {})

/** Several symptoms, none of them an emergency: the kind of week that asks the most. */
const severalSymptoms: Scenario = reader => walk(reader, {
  2: async () => {
    await reader.type('How many hot flushes on an average day?', '5')
    await reader.answer('How strong was the worst one?', 'Moderate')
    await reader.answer('How much did they get in the way?', 'They got in the way of my usual activities (shopping, cooking, going out)')
  },
  3: async () => {
    await reader.answer('What was your worst pain this past week?', '5')
    await reader.tick('Where was the pain?', 'Hips')
    await reader.answer('Is the pain new or worse?', 'Yes')
  },
  5: () => reader.answer('Are your legs or ankles newly swollen?', 'Yes'),
  7: async () => {
    await reader.answer('Have your bowels changed (looser, more often, harder, or not moving)?', 'Yes')
    await reader.readStep()
    await reader.type('How many more bowel movements a day than usual for you?', '2')
    await reader.answer('Any falls?', 'Yes')
    await reader.readStep()
    await reader.answer('Did you hit your head, or hurt yourself?', 'Yes')
  },
  8: () => reader.answer('Feeling down, depressed or hopeless', 'Several days'),
  10: () => reader.type('Anything else the clinic should know?', 'I tripped on the back step on Sunday and bruised my knee.'),
})

/** Waits until Vue has taken over the server-rendered page (a tap before that would be lost). */
async function hydrated(page: Page) {
  await page.waitForFunction(() => {
    const nuxt = (window as unknown as { useNuxtApp?: () => { isHydrating?: boolean } }).useNuxtApp
    return nuxt !== undefined && nuxt().isHydrating === false
  })
}

const PHONE = { viewport: { width: 390, height: 844 }, deviceScaleFactor: 3, hasTouch: true, isMobile: true }

/** Signs in once through the form (sign-ins are rate limited) and keeps the session for every run. */
async function signIn(browser: Browser, appUrl: string) {
  const context = await browser.newContext(PHONE)
  const page = await context.newPage()
  await page.goto(`${appUrl}/sign-in`)
  await hydrated(page)
  await page.getByLabel(/e-mail/i).fill(PATIENT)
  await page.getByLabel(/^password$/i).fill(DEMO_PASSWORD)
  await page.getByRole('button', { name: /^sign in$/i }).click()
  await page.waitForURL(u => !u.pathname.startsWith('/sign-in'))
  const state = await context.storageState()
  await context.close()
  return state
}

const minutes = (ms: number) => `${(ms / 60_000).toFixed(1)} min`

describe('time to fill in the weekly diary on a phone', () => {
  let app: RunningApp
  let browser: Browser
  beforeAll(async () => {
    app = await startApp()
    browser = await chromium.launch({
      executablePath: CHROMIUM,
      args: ['--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run', '--disable-quic'],
    })
  })
  afterAll(async () => {
    await browser?.close()
    await app?.stop()
  })

  it('prints the median time with nothing to report and with several symptoms (aims: 3 and 5 minutes)', async () => {
    const session = await signIn(browser, app.url)
    const next = random(7)
    const rows: Record<string, string> = {
      'runs per scenario': String(RUNS),
      'human time': REAL_TIME ? 'slept for real' : 'modelled, added to the clock (assumptions in the file)',
    }
    for (const [name, scenario, aim, returning] of [
      ['nothing to report, first time', nothingToReport, '3 min', false],
      ['nothing to report, a later week', nothingToReport, '3 min', true],
      ['several symptoms, first time', severalSymptoms, '5 min', false],
      ['several symptoms, a later week', severalSymptoms, '5 min', true],
    ] as const) {
      const totals: number[] = []
      const pageTimes: number[] = []
      for (let run = 0; run < RUNS; run++) {
        const page = await (await browser.newContext({ ...PHONE, storageState: session })).newPage()
        const reader = new Reader(page, next, returning)
        const start = performance.now()
        await page.goto(`${app.url}/diary/new`)
        await page.getByRole('heading', { level: 1, name: 'Weekly diary' }).waitFor()
        // He reads for seconds before his first tap; a script that does not sleep must wait for the page to come alive.
        await hydrated(page)
        await scenario(reader)
        const elapsed = performance.now() - start
        const pageTime = REAL_TIME ? elapsed - reader.humanMs : elapsed
        pageTimes.push(pageTime)
        totals.push(pageTime + reader.humanMs)
        expect(new URL(page.url()).pathname).toMatch(/^\/diary\/\d+$/)
        if (run === 0) rows[`${name}: words read, steps 1 to 11`] = reader.wordsByStep.join(' ')
        await page.context().close()
      }
      const total = percentiles(totals)
      rows[`${name}: median (aim ${aim})`] = minutes(total.median)
      rows[`${name}: slowest run`] = minutes(Math.max(...totals))
      rows[`${name}: page's own part, median`] = `${(percentiles(pageTimes).median / 1000).toFixed(1)} s`
    }
    report('Weekly diary on a 390 x 844 phone (Chromium, scripted reader)', rows)
  })
})

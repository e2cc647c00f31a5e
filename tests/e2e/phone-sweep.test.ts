import type { Page } from 'playwright-core'
import { beforeAll, describe, expect, inject, it } from 'vitest'
import { createPage, seriousAxeViolations, setupBrowser, signInAs } from '../support/browser'
import { Client } from '../support/client'
import { diaryEntry } from '../support/diary'

await setupBrowser()

/*
 * Issue 17's sweep: every page, signed in as each role, in English and Spanish, at 320 and 390
 * px wide. On each page: nothing wider than the screen (the page and its main blocks), no
 * hydration-mismatch warning in the console, no serious or critical axe-core violation, and
 * every control at least 44 x 44 CSS px or with a 44 px hit area around its centre.
 *
 * The 44 px target is WCAG 2.2 success criterion 2.5.5 "Target Size (Enhanced)" (level AAA;
 * 2.5.8 at AA asks 24 px); the issue asks for 44 for men in their seventies and eighties. The
 * hit area is probed where a finger lands: document.elementFromPoint 21 px left, right, above and
 * below the centre must still be the control (or its label, or something inside either), so
 * padding, a ::before/::after overlay or a wrapping label count, as they do for a real tap.
 *
 * The pages are only opened. So that the nurse has a queue item to open whatever ran before,
 * augustin@ (no other browser test writes for him) sends one urgent entry first, and a nurse
 * opens a walk-in injection visit for him, so that today's list has a visit to open. Demo
 * people (server/db/seed/demo.ts): patient@ is Elias Marwood; caregiver@ is Marisol, who may log and confirm for him; dana@ helps Bernard, view only.
 */

const WIDTHS = [390, 320]
const HEIGHT = 844
const SHOTS = '/tmp/phone-shots'

interface Person { email: string, pages: string[], firstLinks?: Record<string, string> }

const PEOPLE: Record<string, Person> = {
  patient: {
    email: 'patient@demo.tidewell.test',
    pages: ['/today', '/diary', '/diary/new', 'first:/diary:a[href^="/diary/"]:not([href="/diary/new"])', '/injections', '/labs', '/contact', '/circle', '/access-history', '/messages'],
  },
  'caregiver who may log': {
    email: 'caregiver@demo.tidewell.test',
    // Not allowed to message: /messages shows the plain notice.
    pages: ['/today', '/diary', '/diary/new', '/injections', '/labs', '/contact', '/messages'],
  },
  'caregiver who may only view': {
    email: 'dana@demo.tidewell.test',
    pages: ['/today', '/diary', '/injections', '/labs', '/contact'],
  },
  nurse: {
    email: 'nurse@demo.tidewell.test',
    pages: ['/staff/triage', 'first:/staff/triage:a[href^="/staff/triage/"]', '/staff', 'first:/staff:a[href^="/staff/patients/"]', 'first:@3:a[href^="/staff/circle/"]', '/staff/due', '/staff/monitoring', '/staff/accounts/new', '/staff/visits', 'first:/staff/visits:a[href^="/staff/patients/"][href*="/visits/"]'],
  },
  clinician: {
    email: 'clinician@demo.tidewell.test',
    pages: ['/staff/triage', '/staff/regimens', '/staff/monitoring', 'first:/staff:a[href^="/staff/patients/"]'],
  },
  admin: {
    email: 'admin@demo.tidewell.test',
    pages: ['/admin', '/admin/audit', '/admin/mail', '/admin/outbox', '/admin/settings', '/staff/regimens', '/staff/accounts/new'],
  },
}

const SIGNED_OUT = ['/sign-in', '/forgot-password', '/set-password?token=not-a-real-token', '/circle/accept?token=not-a-real-token']

/** Everything wrong with the page as it stands, at the viewport it has now. */
async function layoutProblems(page: Page): Promise<string[]> {
  return page.evaluate(() => {
    const problems: string[] = []
    const root = document.documentElement
    if (root.scrollWidth > root.clientWidth) problems.push(`page is ${root.scrollWidth} px wide on a ${root.clientWidth} px screen`)
    const describe = (el: Element) => {
      const id = el.id ? `#${el.id}` : ''
      const test = el.getAttribute('data-testid') ? `[data-testid=${el.getAttribute('data-testid')}]` : ''
      const text = (el.textContent ?? '').trim().replace(/\s+/g, ' ').slice(0, 40)
      return `${el.tagName.toLowerCase()}${id}${test} "${text}"`
    }
    // The main blocks: header, main, footer and each of main's sections, cards and tables.
    const blocks = document.querySelectorAll('body > div header, main, footer, main > *, main section, main table, main form, main svg')
    for (const block of blocks) {
      const box = block.getBoundingClientRect()
      if (box.width === 0) continue
      if (box.right > root.clientWidth + 0.5) problems.push(`${describe(block)} reaches ${Math.round(box.right)} px`)
      const style = getComputedStyle(block)
      const scrolls = style.overflowX === 'auto' || style.overflowX === 'scroll'
      if (scrolls && block.scrollWidth > block.clientWidth + 1) problems.push(`${describe(block)} scrolls sideways (${block.scrollWidth} > ${block.clientWidth})`)
    }
    // Controls: anything a finger may tap.
    const controls = document.querySelectorAll<HTMLElement>('a[href], button, input:not([type=hidden]), select, textarea, summary, [role=button], [role=link], [role=tab], [tabindex]:not([tabindex="-1"])')
    for (const control of controls) {
      const style = getComputedStyle(control)
      if (style.visibility === 'hidden' || control.closest('[hidden], [aria-hidden="true"], [inert]')) continue
      // A visually hidden input (a styled radio or checkbox) is tapped through its label.
      const labels = (control as HTMLInputElement).labels
      const label = labels && labels.length > 0 ? labels[0]! : null
      let target: Element = control
      if (label && (control.getBoundingClientRect().width < 2 || control.getBoundingClientRect().height < 2)) target = label
      let box = target.getBoundingClientRect()
      if (box.width < 2 || box.height < 2) continue // not drawn (the skip link until focused)
      if (box.width >= 44 && box.height >= 44) continue
      control.scrollIntoView({ block: 'center', inline: 'center' })
      box = target.getBoundingClientRect()
      const cx = box.left + box.width / 2
      const cy = box.top + box.height / 2
      const mine = (x: number, y: number) => {
        const hit = document.elementFromPoint(x, y)
        return !!hit && (control.contains(hit) || (!!label && label.contains(hit)))
      }
      const wide = mine(cx - 21, cy) && mine(cx + 21, cy)
      const tall = mine(cx, cy - 21) && mine(cx, cy + 21)
      if (!wide || !tall) problems.push(`${describe(control)} is ${Math.round(box.width)} x ${Math.round(box.height)} px to tap`)
    }
    window.scrollTo(0, 0)
    return problems
  })
}

async function sweep(page: Page, path: string, label: string, problems: string[]) {
  const warnings: string[] = []
  const listen = (message: { type: () => string, text: () => string }) => {
    if (/hydration/i.test(message.text())) warnings.push(message.text().slice(0, 120))
  }
  page.on('console', listen)
  const response = await page.goto(new URL(path, page.url()).href)
  await page.getByRole('heading', { level: 1 }).first().waitFor()
  await page.waitForLoadState('networkidle')
  const where = `${label} ${path}`
  if (!response || response.status() >= 400) problems.push(`${where}: answered ${response?.status()}`)
  if (new URL(page.url()).pathname !== new URL(path, page.url()).pathname) problems.push(`${where}: sent on to ${new URL(page.url()).pathname}`)
  for (const warning of warnings) problems.push(`${where}: console says ${warning}`)
  for (const violation of await seriousAxeViolations(page)) problems.push(`${where}: axe ${violation}`)
  for (const width of WIDTHS) {
    await page.setViewportSize({ width, height: HEIGHT })
    for (const problem of await layoutProblems(page)) problems.push(`${where} at ${width} px: ${problem}`)
  }
  const name = `${label}${path}`.replace(/[^a-z0-9]+/gi, '-').replace(/-+$/, '')
  await page.setViewportSize({ width: 390, height: HEIGHT })
  await page.screenshot({ path: `${SHOTS}/sweep-${name}.png`, fullPage: true })
  page.off('console', listen)
}

/**
 * Resolves "first:/list:selector" to the first link on that list page; "first:@n:selector"
 * looks on the page the n-th entry (from 0) resolved to (the staff circle page is linked from
 * the patient's page).
 */
async function resolve(page: Page, path: string, earlier: string[]): Promise<string> {
  if (!path.startsWith('first:')) return path
  const [, where, selector] = path.split(':')
  const list = where!.startsWith('@') ? earlier[Number(where!.slice(1))] : where
  await page.goto(new URL(list!, page.url()).href)
  await page.getByRole('heading', { level: 1 }).first().waitFor()
  const href = await page.locator(selector!).first().getAttribute('href')
  expect(href, `a link ${selector} on ${list}`).toBeTruthy()
  return href!
}

async function inLanguage(page: Page, language: 'en' | 'es') {
  await page.context().addCookies([{ name: 'tidewell_lang', value: language, url: new URL(page.url()).origin }])
}

describe('every page on a phone, for every role, in both languages', () => {
  beforeAll(async () => {
    const patient = await Client.signIn(inject('appUrl'), 'augustin@demo.tidewell.test')
    const patientId = (await patient.get('/api/_auth/session')).body.user.patientId as number
    // Blood in the urine is urgent (the issue 4 clinic defaults, common practice); a long
    // Spanish word in the note tries the item page's wrapping.
    const sent = await patient.post(`/api/patients/${patientId}/diary`, diaryEntry({ urinary: { blood: true }, note: 'Desde el martes orino con sangre; interdisciplinariamente consultado.' }))
    expect(sent.status).toBe(201)
    // He walks in for his injection: an open visit, so the sweep opens its checklist.
    const nurse = await Client.signIn(inject('appUrl'), 'nurse2@demo.tidewell.test')
    const opened = await nurse.post(`/api/patients/${patientId}/visits`, { appointmentId: null })
    expect(opened.status).toBeLessThan(300)
  })

  for (const language of ['en', 'es'] as const) {
    it(`signed out (${language})`, async () => {
      const page = await createPage('/sign-in')
      await inLanguage(page, language)
      const problems: string[] = []
      for (const path of SIGNED_OUT) await sweep(page, path, `signed-out ${language}`, problems)
      await page.close()
      expect(problems, `\n${problems.join('\n')}\n`).toEqual([])
    })

    for (const [role, person] of Object.entries(PEOPLE)) {
      it(`${role} (${language})`, async () => {
        const page = await signInAs(person.email)
        await inLanguage(page, language)
        const problems: string[] = []
        const paths: string[] = []
        for (const path of person.pages) paths.push(await resolve(page, path, paths))
        for (const path of paths) await sweep(page, path, `${role} ${language}`, problems)
        expect(await page.getAttribute('html', 'lang')).toMatch(new RegExp(`^${language}`))
        await page.close()
        expect(problems, `\n${problems.join('\n')}\n`).toEqual([])
      })
    }
  }

  it('the nurse\'s queue on a 1280 x 800 laptop shows its first item inside the first screen', async () => {
    const page = await signInAs('nurse@demo.tidewell.test')
    await page.setViewportSize({ width: 1280, height: 800 })
    await page.goto(new URL('/staff/triage', page.url()).href)
    const first = page.locator('tr[data-item]').first()
    await first.waitFor()
    const box = await first.boundingBox()
    await page.screenshot({ path: `${SHOTS}/nurse-queue-1280.png` })
    await page.close()
    expect(box!.y + box!.height).toBeLessThanOrEqual(800)
  })
})

import { readFileSync } from 'node:fs'
import { createRequire } from 'node:module'
import type { Page } from 'playwright-core'
import { inject } from 'vitest'
import { createPage, setup, url } from '@nuxt/test-utils/e2e'
import { DEMO_PASSWORD, totpCode } from './client'

export const CHROMIUM = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium'

/** Points @nuxt/test-utils at the shared built server and Debian's Chromium. */
export async function setupBrowser() {
  await setup({
    host: inject('appUrl'),
    browser: true,
    browserOptions: {
      type: 'chromium',
      launch: {
        executablePath: CHROMIUM,
        args: ['--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run', '--disable-quic'],
      },
    },
  })
}

export { createPage, url }

/** Signs in through the real form and waits for the role's home page. */
export async function signInAs(email: string, password = DEMO_PASSWORD): Promise<Page> {
  const page = await createPage('/sign-in')
  await page.getByLabel(/e-mail|correo/i).fill(email)
  await page.getByLabel(/^(password|contraseña)$/i).fill(password)
  await page.getByRole('button', { name: /^(sign in|iniciar sesión)$/i }).click()
  await page.waitForURL(u => !u.pathname.startsWith('/sign-in'))
  // Staff give a code from the demo secret on the second-factor page.
  if (new URL(page.url()).pathname === '/second-factor') {
    await page.getByLabel(/^(code from your app|código de su aplicación)$/i).fill(await totpCode(new URL(page.url()).origin, email))
    await page.getByRole('button', { name: /^(continue|continuar)$/i }).click()
    await page.waitForURL(u => !u.pathname.startsWith('/second-factor'))
  }
  return page
}

const axeSource = readFileSync(createRequire(import.meta.url).resolve('axe-core/axe.min.js'), 'utf8')

/**
 * Runs axe-core inside the page and returns the serious and critical violations. axe is
 * evaluated through the browser's debugging protocol, not added as a <script>: the page's
 * Content-Security-Policy refuses an inline script without its nonce, as it should.
 */
export async function seriousAxeViolations(page: Page) {
  await page.evaluate(axeSource)
  const results = await page.evaluate(async () => {
    const axe = (window as unknown as { axe: { run: (ctx: Document) => Promise<{ violations: { id: string, impact: string, help: string, nodes: unknown[] }[] }> } }).axe
    return axe.run(document)
  })
  return results.violations.filter(v => v.impact === 'serious' || v.impact === 'critical').map(v => `${v.id}: ${v.help} (${v.nodes.length})`)
}

import { request } from 'node:http'
import { brotliDecompressSync, gunzipSync } from 'node:zlib'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { RunningApp } from '../support/app'
import { startApp } from '../support/app'

/*
 * The built server sends the precompressed copies that nitro.compressPublicAssets writes at
 * build time (file.js.br, file.js.gz beside file.js) to a browser that accepts them. Page HTML
 * and JSON are made per request and compressed on the way out (gzip, above 1 kB). Node's own http client is used here because fetch would
 * decompress the body and hide what went over the wire.
 */

let app: RunningApp

beforeAll(async () => {
  app = await startApp()
})
afterAll(async () => {
  await app?.stop()
})

interface RawReply { status: number, headers: Record<string, string | string[] | undefined>, body: Buffer }

function get(path: string, acceptEncoding?: string): Promise<RawReply> {
  return new Promise((done, fail) => {
    const req = request(new URL(path, app.url), { headers: acceptEncoding === undefined ? {} : { 'accept-encoding': acceptEncoding } }, (res) => {
      const chunks: Buffer[] = []
      res.on('data', chunk => chunks.push(chunk))
      res.on('end', () => done({ status: res.statusCode ?? 0, headers: res.headers, body: Buffer.concat(chunks) }))
      res.on('error', fail)
    })
    req.on('error', fail)
    req.end()
  })
}

function decoded(reply: RawReply) {
  const encoding = reply.headers['content-encoding']
  if (encoding === 'br') return brotliDecompressSync(reply.body)
  if (encoding === 'gzip') return gunzipSync(reply.body)
  expect(encoding).toBeUndefined()
  return reply.body
}

/** The app's entry script, named in the sign-in page (it is far above Nitro's 1 kB floor for compressing). */
async function entryScript() {
  const page = await get('/sign-in')
  const src = /<script[^>]* type="module" src="(\/_nuxt\/[^"]+\.js)"/.exec(page.body.toString('utf8'))?.[1]
  expect(src, 'the sign-in page names its entry script').toBeTruthy()
  return src!
}

describe('precompressed static assets', () => {
  it('answers a JavaScript file under /_nuxt/ in brotli to a browser that accepts br, and it decodes to the same file', async () => {
    const src = await entryScript()
    const plain = await get(src)
    expect(plain.status).toBe(200)
    expect(plain.headers['content-encoding']).toBeUndefined()
    expect(plain.body.length).toBeGreaterThan(1024)

    const br = await get(src, 'br')
    expect(br.status).toBe(200)
    expect(br.headers['content-encoding']).toBe('br')
    expect(br.headers['content-type']).toMatch(/javascript/)
    expect(String(br.headers.vary)).toMatch(/accept-encoding/i)
    expect(br.body.length).toBeLessThan(plain.body.length / 2)
    expect(brotliDecompressSync(br.body).equals(plain.body)).toBe(true)
  })

  it('answers the same file in gzip to a browser that accepts only gzip, and prefers br when both are offered', async () => {
    const src = await entryScript()
    const plain = await get(src)

    const gzip = await get(src, 'gzip')
    expect(gzip.status).toBe(200)
    expect(gzip.headers['content-encoding']).toBe('gzip')
    expect(gzip.body.length).toBeLessThan(plain.body.length / 2)
    expect(gunzipSync(gzip.body).equals(plain.body)).toBe(true)

    const both = await get(src, 'gzip, deflate, br')
    expect(both.headers['content-encoding']).toBe('br')
    expect(brotliDecompressSync(both.body).equals(plain.body)).toBe(true)
  })

  it('compresses the stylesheet the pages load too', async () => {
    const html = (await get('/sign-in')).body.toString('utf8')
    const css = /<link[^>]* rel="stylesheet" href="(\/_nuxt\/[^"]+\.css)"/.exec(html)?.[1]
    expect(css, 'the sign-in page names its stylesheet').toBeTruthy()
    const reply = await get(css!, 'br')
    expect(reply.headers['content-encoding']).toBe('br')
    expect(decoded(reply).toString('utf8')).toMatch(/@font-face/)
  })

  it('sends the page HTML gzip-compressed to a browser that accepts it, and whole to one that does not', async () => {
    const page = await get('/sign-in', 'br, gzip')
    expect(page.status).toBe(200)
    expect(page.headers['content-type']).toMatch(/text\/html/)
    // Rendered per request: compressed on the way out (server/plugins/07.compression.ts), gzip.
    expect(page.headers['content-encoding']).toBe('gzip')
    expect(String(page.headers.vary)).toMatch(/accept-encoding/i)
    const html = decoded(page).toString('utf8')
    expect(html).toMatch(/^<!DOCTYPE html>/i)
    expect(html).toMatch(/<\/html>\s*$/)
    expect(html).toMatch(/<script[^>]* type="module" src="\/_nuxt\//)
    expect(page.body.length).toBeLessThan(html.length / 2)

    const plain = await get('/sign-in')
    expect(plain.headers['content-encoding']).toBeUndefined()
    expect(plain.body.toString('utf8')).toMatch(/^<!DOCTYPE html>/i)
  })

  it('compresses a large JSON answer (the locale messages) and leaves a small one (the clinic) as it is', async () => {
    const entry = (await get(await entryScript())).body.toString('utf8')
    const hash = /\ben:"([0-9a-f]{8})",es:"[0-9a-f]{8}"/.exec(entry)?.[1]
    const messages = await get(`/_i18n/${hash}/en/messages.json`, 'gzip')
    expect(messages.headers['content-encoding']).toBe('gzip')
    expect(JSON.parse(gunzipSync(messages.body).toString('utf8')).en.auth).toBeTruthy()

    const clinic = await get('/api/clinic', 'gzip')
    expect(clinic.status).toBe(200)
    expect(clinic.headers['content-encoding']).toBeUndefined()
    expect(JSON.parse(clinic.body.toString('utf8')).clinicName).toBeTruthy()
  })
})

describe('what a second visit does not download again', () => {
  it('build files under /_nuxt/ are cached for a year (their names change with their contents)', async () => {
    const reply = await get(await entryScript(), 'br')
    expect(reply.headers['cache-control']).toMatch(/max-age=31536000/)
    expect(reply.headers['cache-control']).toMatch(/immutable/)
  })

  it('the locale messages, at an address that holds a hash of the locale files, are cached for a day', async () => {
    // The entry script holds the hash of each locale's messages ({en:"1a2b3c4d",es:…}); the
    // browser fetches /_i18n/<hash>/<locale>/messages.json.
    const entry = (await get(await entryScript())).body.toString('utf8')
    const hash = /\ben:"([0-9a-f]{8})",es:"[0-9a-f]{8}"/.exec(entry)?.[1]
    expect(hash, 'the entry script names the messages hash').toBeTruthy()
    const reply = await get(`/_i18n/${hash}/en/messages.json`)
    expect(reply.status).toBe(200)
    expect(JSON.parse(reply.body.toString('utf8')).en.auth).toBeTruthy()
    expect(reply.headers['cache-control']).toMatch(/max-age=86400\b/)
  })
})

import { connect } from 'node:net'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { RunningApp } from '../support/app'
import { startApp } from '../support/app'
import { Client } from '../support/client'
import { freePort } from '../support/ports'
import { sql } from '../support/sqlite'

/** Whether something listens on 127.0.0.1:port. */
const listening = (port: number) => new Promise<boolean>((done) => {
  const socket = connect(port, '127.0.0.1')
  socket.once('connect', () => {
    socket.destroy()
    done(true)
  })
  socket.once('error', () => done(false))
})

let app: RunningApp
let catcherPort: number

beforeAll(async () => {
  catcherPort = await freePort()
  app = await startApp({ env: { NUXT_MAIL_CATCHER_PORT: String(catcherPort) } })
})
afterAll(async () => {
  await app?.stop()
})

describe('the local mail catcher', () => {
  it('runs in the demo, and every admin read of it is in the audit trail', async () => {
    expect(await listening(catcherPort)).toBe(true)
    const admin = await Client.signIn(app.url, 'admin@demo.tidewell.test')
    expect((await admin.get('/api/admin/mail')).body.enabled).toBe(true)
    await admin.get('/api/admin/mail')
    const rows = await sql<{ actor_role: string, outcome: string }>(app, `SELECT actor_role, outcome FROM audit_events WHERE action = 'mail-catcher.read'`)
    expect(rows).toEqual([{ actor_role: 'admin', outcome: 'done' }, { actor_role: 'admin', outcome: 'done' }])
  })

  it('account-list reads are in the audit trail', async () => {
    const admin = await Client.signIn(app.url, 'admin@demo.tidewell.test')
    expect((await admin.get('/api/users')).status).toBe(200)
    const rows = await sql<{ n: number }>(app, `SELECT COUNT(*) AS n FROM audit_events WHERE action = 'users.read' AND actor_role = 'admin'`)
    expect(rows[0]!.n).toBe(1)
  })

  it('is off outside development and the demo unless NUXT_MAIL_CATCHER=true', async () => {
    await app.stop({ keepData: true })
    const dataDir = app.dataDir
    app = await startApp({ dataDir, env: { NUXT_SEED_DEMO: 'false', NUXT_MAIL_CATCHER_PORT: String(catcherPort) } })
    expect(await listening(catcherPort)).toBe(false)
    const admin = await Client.signIn(app.url, 'admin@demo.tidewell.test')
    expect((await admin.get('/api/admin/mail')).body).toEqual({ enabled: false, messages: [] })

    await app.stop({ keepData: true })
    app = await startApp({ dataDir, env: { NUXT_SEED_DEMO: 'false', NUXT_MAIL_CATCHER: 'true', NUXT_MAIL_CATCHER_PORT: String(catcherPort) } })
    expect(await listening(catcherPort)).toBe(true)
  })
})

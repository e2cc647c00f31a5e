import type { ParsedMail } from 'mailparser'
import { simpleParser } from 'mailparser'
import { SMTPServer } from 'smtp-server'
import { freePort } from './ports'

export interface CaughtMessage {
  to: string
  subject: string
  text: string
  html: string
  messageId: string
  attachments: ParsedMail['attachments']
}

/**
 * A real SMTP server on loopback that keeps what it receives, for the tests. It can be
 * stopped and started again on the same port to play a mail outage.
 */
export class MailCatcher {
  readonly messages: CaughtMessage[] = []
  private server: SMTPServer | undefined

  private constructor(readonly port: number) {}

  static async start(port?: number): Promise<MailCatcher> {
    const catcher = new MailCatcher(port ?? await freePort())
    await catcher.resume()
    return catcher
  }

  get url() {
    return `smtp://127.0.0.1:${this.port}`
  }

  async resume() {
    const server = new SMTPServer({
      authOptional: true,
      disabledCommands: ['AUTH', 'STARTTLS'],
      logger: false,
      onData: (stream, _session, callback) => {
        simpleParser(stream).then((mail) => {
          this.messages.push({
            to: [mail.to].flat().filter(Boolean).map(a => (a as { text: string }).text).join(', '),
            subject: mail.subject ?? '',
            text: mail.text ?? '',
            html: typeof mail.html === 'string' ? mail.html : '',
            messageId: mail.messageId ?? '',
            attachments: mail.attachments,
          })
          callback()
        }).catch(error => callback(error as Error))
      },
    })
    await new Promise<void>((done, fail) => {
      server.once('error', fail)
      server.listen(this.port, '127.0.0.1', () => done())
    })
    this.server = server
  }

  async stop() {
    const server = this.server
    this.server = undefined
    if (server) await new Promise<void>(done => server.close(() => done()))
  }

  /** Waits until a message matching the test arrives (or fails after timeoutMs). */
  async waitFor(test: (m: CaughtMessage) => boolean, timeoutMs = 15_000): Promise<CaughtMessage> {
    const deadline = Date.now() + timeoutMs
    while (Date.now() < deadline) {
      const found = this.messages.find(test)
      if (found) return found
      await new Promise(r => setTimeout(r, 100))
    }
    throw new Error(`no matching e-mail within ${timeoutMs} ms; received: ${this.messages.map(m => `${m.to}: ${m.subject}`).join(' | ') || 'none'}`)
  }
}

/** The first http(s) link in a text e-mail. */
export function linkIn(text: string): string {
  const match = text.match(/https?:\/\/\S+/)
  if (!match) throw new Error(`no link in e-mail:\n${text}`)
  return match[0]
}

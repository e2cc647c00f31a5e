import nodemailer from 'nodemailer'
import type { Transporter } from 'nodemailer'

let transporter: Transporter | undefined

/** SMTP transport: SMTP_URL when set, otherwise the local mail catcher on loopback. */
export function useMailer(): Transporter {
  if (!transporter) {
    const config = useRuntimeConfig()
    transporter = config.smtpUrl
      ? nodemailer.createTransport(config.smtpUrl)
      : nodemailer.createTransport({ host: '127.0.0.1', port: Number(config.mailCatcherPort), secure: false, ignoreTLS: true })
  }
  return transporter
}

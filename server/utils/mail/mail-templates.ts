import type { Language } from '#shared/auth/roles'

export interface RenderedMail {
  subject: string
  text: string
  html: string
}

const escapeHtml = (value: string) => value
  .replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;').replace(/'/g, '&#39;')

/**
 * Renders an e-mail from locale keys mail.<template>.subject, .greeting, .body (paragraphs
 * split on blank lines), .action (button text) and the shared mail.footer; plain text and
 * HTML carry the same words. E-mails never carry clinical details or patient names beyond
 * the recipient's own name.
 */
export function renderMail(
  template: string,
  language: Language,
  params: Record<string, string | number>,
  link?: string,
): RenderedMail {
  const t = (key: string) => translate(language, key, params)
  const paragraphs = [t(`mail.${template}.greeting`), ...t(`mail.${template}.body`).split(/\n\s*\n/)]
  const footer = t('mail.footer')
  const action = link ? t(`mail.${template}.action`) : ''
  const text = [
    ...paragraphs,
    ...(link ? [`${action}: ${link}`] : []),
    '--',
    footer,
  ].join('\n\n')
  const html = [
    '<!doctype html><html><body style="font-family:Arial,sans-serif;font-size:18px;line-height:1.6;color:#111b35;background:#fcf9f3;padding:24px">',
    ...paragraphs.map(p => `<p>${escapeHtml(p)}</p>`),
    link ? `<p><a href="${escapeHtml(link)}" style="display:inline-block;background:#1a2748;color:#ffffff;padding:12px 20px;border-radius:8px;text-decoration:none;font-weight:bold">${escapeHtml(action)}</a></p><p style="font-size:15px">${escapeHtml(link)}</p>` : '',
    `<hr><p style="font-size:15px">${escapeHtml(footer)}</p>`,
    '</body></html>',
  ].join('')
  return { subject: t(`mail.${template}.subject`), text, html }
}

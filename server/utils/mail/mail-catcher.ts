/**
 * Whether the local mail catcher runs: only without NUXT_SMTP_URL, and then only in
 * development, in the demo (NUXT_SEED_DEMO) or when NUXT_MAIL_CATCHER=true, because it
 * keeps every reset and invitation link where an admin can read them.
 */
export function mailCatcherEnabled(): boolean {
  const config = useRuntimeConfig()
  return !config.smtpUrl && (import.meta.dev || Boolean(config.seedDemo) || String(config.mailCatcher) === 'true')
}

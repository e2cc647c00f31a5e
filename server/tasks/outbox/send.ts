// Not claimed once across instances (runTaskOnce): each instance may run it at any time,
// since every message is claimed by one sender (processOutbox in server/utils/mail/outbox.ts).
export default defineTask({
  meta: { name: 'outbox:send', description: 'Send every queued e-mail that is due' },
  async run({ payload }) {
    const now = typeof payload.now === 'string' ? new Date(payload.now) : undefined
    const sent = await processOutbox(now ? () => now : undefined)
    return { result: { sent } }
  },
})

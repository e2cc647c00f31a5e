export default defineTask({
  meta: { name: 'triage:escalate', description: 'Send items still new after their respond-by time to the clinicians' },
  async run({ payload }) {
    const now = typeof payload.now === 'string' ? new Date(payload.now) : new Date()
    return { result: { escalated: await escalateOverdueItems(now) } }
  },
})

export default defineTask({
  meta: { name: 'triage:escalate', description: 'Send items still new after their respond-by time to the clinicians' },
  run: ({ payload }) => runTaskOnce('triage:escalate', payload, async now => ({ escalated: await escalateOverdueItems(now) })),
})

export default defineTask({
  meta: { name: 'triage:overdue', description: 'Open an urgent item for every injection past its window, once per cycle' },
  async run({ payload }) {
    const now = typeof payload.now === 'string' ? new Date(payload.now) : new Date()
    return { result: { opened: await openOverdueInjectionItems(now) } }
  },
})

export default defineTask({
  meta: { name: 'triage:overdue', description: 'Open an urgent item for every injection past its window, once per cycle' },
  run: ({ payload }) => runTaskOnce('triage:overdue', payload, async now => ({ opened: await openOverdueInjectionItems(now) })),
})

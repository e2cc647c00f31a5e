export default defineTask({
  meta: { name: 'attachments:prune', description: 'Remove uploads never sent with a message, a day after they were made' },
  run: ({ payload }) => runTaskOnce('attachments:prune', payload, async now => ({ removed: await prunePendingUploads(now) })),
})

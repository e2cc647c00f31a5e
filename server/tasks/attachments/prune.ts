export default defineTask({
  meta: { name: 'attachments:prune', description: 'Remove uploads never sent with a message, a day after they were made' },
  async run({ payload }) {
    const now = typeof payload.now === 'string' ? new Date(payload.now) : new Date()
    return { result: { removed: await prunePendingUploads(now) } }
  },
})

export default defineTask({
  meta: { name: 'diary:remind', description: 'Remind patients whose last diary entry is a week old or more' },
  async run({ payload }) {
    const now = typeof payload.now === 'string' ? new Date(payload.now) : new Date()
    return { result: { reminded: await sendDiaryReminders(now) } }
  },
})

export default defineTask({
  meta: { name: 'diary:remind', description: 'Remind patients whose last diary entry is a week old or more' },
  run: ({ payload }) => runTaskOnce('diary:remind', payload, async now => ({ reminded: await sendDiaryReminders(now) })),
})

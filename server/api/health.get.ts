export default defineEventHandler(async () => {
  await useDb()
  return { ok: true }
})

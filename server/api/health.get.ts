export default defineEventHandler(async () => {
  await whenSeeded()
  return { ok: true }
})

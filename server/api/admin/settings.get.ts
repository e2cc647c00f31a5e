/** The clinic settings as they stand (admins). */
export default defineEventHandler(async (event) => {
  await requireRole(event, ['admin'])
  return getSettings()
})

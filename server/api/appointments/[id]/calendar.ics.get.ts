/** The appointment as an iCalendar file, in the language of the person asking. */
export default defineEventHandler(async (event) => {
  const { access, appointment } = await authorizeAppointment(event, 'patient.read')
  const settings = await getSettings()
  setResponseHeaders(event, {
    'content-type': CALENDAR_CONTENT_TYPE,
    'content-disposition': 'attachment; filename="tidewell-appointment.ics"',
    'cache-control': 'private, no-store',
  })
  return appointmentCalendar(appointment, { language: access.user.language, settings })
})

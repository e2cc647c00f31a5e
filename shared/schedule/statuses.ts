/** Where an appointment stands. Open ones still lie ahead of the patient. */
export const APPOINTMENT_STATUSES = ['booked', 'confirmed', 'change-requested', 'cancelled', 'done'] as const
export type AppointmentStatus = (typeof APPOINTMENT_STATUSES)[number]
export const OPEN_APPOINTMENT_STATUSES = ['booked', 'confirmed', 'change-requested'] as const satisfies readonly AppointmentStatus[]

/** A patient's request for another time, and the clinic's answer. */
export const CHANGE_REQUEST_STATUSES = ['open', 'answered', 'withdrawn'] as const
export type ChangeRequestStatus = (typeof CHANGE_REQUEST_STATUSES)[number]
/** What the patient asks: another time, or to cancel (staff cancel it with a reason). */
export const CHANGE_REQUEST_KINDS = ['move', 'cancel'] as const
export type ChangeRequestKind = (typeof CHANGE_REQUEST_KINDS)[number]
export const CHANGE_DECISIONS = ['move', 'keep'] as const
export type ChangeDecision = (typeof CHANGE_DECISIONS)[number]

/** Due-list groups, most pressing first. */
export const DUE_GROUPS = ['overdue', 'late', 'this-week', 'next-two-weeks', 'not-started'] as const
export type DueGroup = (typeof DUE_GROUPS)[number]

import type { AcceptedMime, AttachmentKind } from '../attachments/rules'
import type { Attribution } from '../common/attribution'

/** A checked file as the API shows it; its bytes only ever come from `url` (a download). */
export interface AttachmentView {
  id: number
  kind: AttachmentKind
  mime: AcceptedMime
  fileName: string
  byteSize: number
  width: number | null
  height: number | null
  pages: number | null
  /** The lab result it was filed as, if staff filed it. */
  labResultId: number | null
  url: string
}

/** Who wrote a message: a caregiver by name, "on behalf of" wherever someone else than the patient writes. */
export interface MessageAuthor extends Attribution {
  onBehalf: boolean
}

export interface MessageView {
  id: number
  threadId: number
  body: string
  sentAt: string
  author: MessageAuthor
  /** Written by the person asking. */
  mine: boolean
  /** Read by the person asking (his own messages count as read). */
  read: boolean
  attachments: AttachmentView[]
  /** Staff only: marked entered in error (the patient's circle never sees such a message). */
  enteredInError?: { at: string, by: string, reason: string } | null
  /** Staff only, on a staff message: who in the patient's circle has read it, and when. */
  readBy?: { name: string, relation: Attribution['relation'], readAt: string }[]
}

export interface ThreadView {
  id: number
  subject: string
  startedBy: MessageAuthor
  startedAt: string
  lastMessageAt: string
  /** Messages in it the person asking has not read. */
  unread: number
  messages: MessageView[]
}

export interface MessagesView {
  threads: ThreadView[]
  unread: number
  /** What the person asking may do here (from the access policy). */
  can: { write: boolean, manage: boolean }
}

/** POST /api/patients/:id/messages when the sender said yes to a right-now sign: nothing stored as a message. */
export interface RightNowAnswer {
  rightNow: true
  entryId: number
}

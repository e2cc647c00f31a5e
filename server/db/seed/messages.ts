import type { Transaction } from 'sequelize'
import { Message, MessageRead, MessageThread, Patient, User } from '../models'

/*
 * A few invented conversations between patients and the care team of the demo clinic.
 * They are history: every question from a patient was answered, so they come with no open
 * queue item (nothing new for the triage queue) and the care team has read them. The last
 * one is a note the clinic started that Kenji has not read yet (one unread in his header).
 */

interface DemoMessage { from: string, daysAgo: number, body: string, readBy: string[] }
interface DemoThread { patient: string, subject: string, messages: DemoMessage[] }

const NURSE = 'nurse@demo.tidewell.test'
const NURSE2 = 'nurse2@demo.tidewell.test'
const CLINICIAN = 'clinician@demo.tidewell.test'
/** His wife, the demo caregiver allowed to message: she has read his conversations. */
const MARISOL = 'caregiver@demo.tidewell.test'

const CONVERSATIONS: DemoThread[] = [
  {
    patient: 'LPU-1001',
    subject: 'Hot flushes at night',
    messages: [
      { from: 'patient@demo.tidewell.test', daysAgo: 9, body: 'The hot flushes wake me two or three times a night since the last injection. Is there anything I can try before my next visit?', readBy: [NURSE, MARISOL] },
      { from: NURSE, daysAgo: 8, body: 'Thank you for telling us. A cooler bedroom, a fan and layers you can take off often help, and cutting back on coffee and alcohol in the evening. Please keep logging them in the weekly diary; we will talk about other options at your next visit.', readBy: ['patient@demo.tidewell.test', MARISOL] },
      { from: 'patient@demo.tidewell.test', daysAgo: 8, body: 'Thank you, I will try the fan.', readBy: [NURSE, MARISOL] },
    ],
  },
  {
    patient: 'LPU-1001',
    subject: 'Lift to the next appointment',
    messages: [
      { from: MARISOL, daysAgo: 4, body: 'I will drive him to the next injection. Can I wait with him in the room while the nurse gives it?', readBy: [NURSE2, 'patient@demo.tidewell.test'] },
      { from: NURSE2, daysAgo: 3, body: 'Yes, of course. Please come ten minutes early so we can go through his week together first.', readBy: [MARISOL, 'patient@demo.tidewell.test'] },
    ],
  },
  {
    patient: 'LPU-1003',
    subject: 'Análisis antes de la cita',
    messages: [
      { from: 'luis@demo.tidewell.test', daysAgo: 6, body: '¿Tengo que hacerme el análisis de PSA antes de la próxima inyección o el mismo día?', readBy: [CLINICIAN] },
      { from: CLINICIAN, daysAgo: 5, body: 'Puede hacérselo el mismo día de la cita, antes de la inyección. No hace falta estar en ayunas para el PSA.', readBy: ['luis@demo.tidewell.test'] },
    ],
  },
  {
    patient: 'LPU-1006',
    subject: 'Please bring your medicine list',
    messages: [
      { from: NURSE2, daysAgo: 1, body: 'At your next visit we will go through your heart and blood-pressure medicines. Please bring the list, or the boxes, with you.', readBy: [] },
    ],
  },
]

export async function seedDemoConversations(transaction: Transaction) {
  const people = new Map((await User.findAll({ transaction })).map(user => [user.email, user]))
  const now = Date.now()
  for (const conversation of CONVERSATIONS) {
    const patient = await Patient.findOne({ where: { clinicNumber: conversation.patient }, transaction })
    if (!patient) continue
    const at = (daysAgo: number) => new Date(now - daysAgo * 86_400_000)
    const first = conversation.messages[0]!
    const last = conversation.messages[conversation.messages.length - 1]!
    const thread = await MessageThread.create({
      patientId: patient.id,
      subject: conversation.subject,
      startedByUserId: people.get(first.from)!.id,
      lastMessageAt: at(last.daysAgo),
      createdAt: at(first.daysAgo),
    }, { transaction })
    for (const demo of conversation.messages) {
      const author = people.get(demo.from)!
      const sentAt = at(demo.daysAgo)
      const message = await Message.create({
        threadId: thread.id,
        patientId: patient.id,
        authorUserId: author.id,
        body: demo.body,
        enteredInErrorAt: null,
        enteredInErrorByUserId: null,
        enteredInErrorReason: null,
        requestId: null,
        createdAt: sentAt,
        updatedAt: sentAt,
      }, { transaction })
      const readers = [author.email, ...demo.readBy].map(email => people.get(email)!)
      await MessageRead.bulkCreate(readers.map(reader => ({ messageId: message.id, userId: reader.id, readAt: new Date(sentAt.getTime() + 3_600_000) })), { transaction })
    }
  }
}

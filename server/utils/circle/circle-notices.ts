import type { Transaction } from 'sequelize'
import { User } from '../../db/models'
import type { Patient } from '../../db/models'

/*
 * E-mails about care-circle changes, queued in the transaction of the change (outbox). Like
 * every Tidewell e-mail they carry no health data and no name but the recipient's own.
 */

/**
 * When staff (not the patient himself) invite, change or remove a caregiver, or withdraw an
 * invitation, the patient is told in his language, with a link to review his circle.
 */
export async function noticeCircleChangedByStaff(relation: string, patient: Patient, transaction: Transaction): Promise<void> {
  if (relation !== 'staff') return
  const owner = await User.findByPk(patient.userId, { transaction })
  if (!owner?.active) return
  await enqueueMail({
    ...mailTo(owner),
    template: 'circleChangedByClinic',
    params: { name: owner.name },
    linkPath: '/circle',
  }, transaction)
}

/** A caregiver removed from a circle (by the patient or by staff) is told his access ended. */
export async function noticeCaregiverRemoved(caregiverUserId: number, transaction: Transaction): Promise<void> {
  const caregiver = await User.findByPk(caregiverUserId, { transaction })
  if (!caregiver?.active) return
  await enqueueMail({
    ...mailTo(caregiver),
    template: 'circleRemoved',
    params: { name: caregiver.name },
  }, transaction)
}

import { Op } from 'sequelize'
import type { Transaction } from 'sequelize'
import { CONTACT_PREFERENCES } from '#shared/contact/schemas'
import type { ContactPreference } from '#shared/contact/schemas'
import type { CaregiverContactView, PatientContactView } from '#shared/contact/views'
import type { Patient } from '../../db/models'
import { CareGrant, User } from '../../db/models'

/** His phones, best times and preferred contact as stored (an unknown preference reads as phone). */
export function contactOf(patient: Patient): PatientContactView {
  const preferred = (CONTACT_PREFERENCES as readonly string[]).includes(patient.preferredContact) ? patient.preferredContact as ContactPreference : 'phone'
  return {
    phones: Array.isArray(patient.phones) ? patient.phones.map(phone => ({ label: phone.label, number: phone.number })) : [],
    bestTimes: patient.bestTimesToCall ?? '',
    preferred,
  }
}

/** The caregivers in his circle now (not revoked, account active), with their own phones. */
export async function caregiverContacts(patientId: number, transaction?: Transaction): Promise<CaregiverContactView[]> {
  const grants = await CareGrant.findAll({
    where: { patientId, revokedAt: { [Op.is]: null } },
    include: [{ model: User, as: 'caregiver', attributes: ['id', 'name', 'phone'], where: { active: true } }],
    order: [['createdAt', 'ASC'], ['id', 'ASC']],
    transaction,
  })
  return grants.map(grant => ({ name: grant.caregiver!.name, phone: grant.caregiver!.phone ?? null }))
}

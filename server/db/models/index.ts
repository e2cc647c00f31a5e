import type { Sequelize } from 'sequelize'
import { Appointment } from './appointment'
import { AppointmentChangeRequest } from './appointment-change-request'
import { Attachment } from './attachment'
import { AuditEvent } from './audit-event'
import { CareGrant } from './care-grant'
import { CaughtMail } from './caught-mail'
import { CircleInvitation } from './circle-invitation'
import { ClinicSetting } from './clinic-setting'
import { DiaryEntry } from './diary-entry'
import { Injection } from './injection'
import { LabResult } from './lab-result'
import { MonitoringItem, MonitoringPlan } from './monitoring'
import { Message } from './message'
import { MessageRead } from './message-read'
import { MessageThread } from './message-thread'
import { OneTimeToken } from './one-time-token'
import { OutboxMessage } from './outbox-message'
import { Patient } from './patient'
import { PatientRegimen } from './patient-regimen'
import { Regimen } from './regimen'
import { SignInFailure } from './sign-in-failure'
import { TaskRun } from './task-run'
import { TotpRecoveryCode } from './totp-recovery-code'
import { TriageEvent } from './triage-event'
import { TriageItem } from './triage-item'
import { User } from './user'
import { UserSession } from './user-session'
import { Visit, VisitKit } from './visit'

export { Appointment, AppointmentChangeRequest, Attachment, AuditEvent, CareGrant, CaughtMail, CircleInvitation, ClinicSetting, DiaryEntry, Injection, LabResult, Message, MessageRead, MessageThread, MonitoringItem, MonitoringPlan, OneTimeToken, OutboxMessage, Patient, PatientRegimen, Regimen, SignInFailure, TaskRun, TotpRecoveryCode, TriageEvent, TriageItem, User, UserSession, Visit, VisitKit }

/** Registers every model and its associations on one connection. */
export function initModels(sequelize: Sequelize) {
  for (const model of [User, Patient, CareGrant, AuditEvent, OutboxMessage, OneTimeToken, SignInFailure, CaughtMail, ClinicSetting, CircleInvitation, DiaryEntry, Regimen, PatientRegimen, Injection, Appointment, AppointmentChangeRequest, TriageItem, TriageEvent, TotpRecoveryCode, UserSession, TaskRun]) {
    model.initModel(sequelize)
  }
  User.hasOne(Patient, { foreignKey: { name: 'userId', field: 'user_id', allowNull: false }, as: 'patient' })
  Patient.belongsTo(User, { foreignKey: { name: 'userId', field: 'user_id', allowNull: false }, as: 'user' })
  User.hasMany(UserSession, { foreignKey: { name: 'userId', field: 'user_id', allowNull: false }, as: 'sessions' })
  UserSession.belongsTo(User, { foreignKey: { name: 'userId', field: 'user_id', allowNull: false }, as: 'user' })
  Patient.hasMany(CareGrant, { foreignKey: { name: 'patientId', field: 'patient_id', allowNull: false }, as: 'grants' })
  CareGrant.belongsTo(Patient, { foreignKey: { name: 'patientId', field: 'patient_id', allowNull: false }, as: 'patient' })
  CareGrant.belongsTo(User, { foreignKey: { name: 'caregiverUserId', field: 'caregiver_user_id', allowNull: false }, as: 'caregiver' })
  CareGrant.belongsTo(User, { foreignKey: { name: 'grantedByUserId', field: 'granted_by_user_id', allowNull: false }, as: 'grantedBy' })
  CareGrant.belongsTo(User, { foreignKey: { name: 'updatedByUserId', field: 'updated_by_user_id', allowNull: true }, as: 'updatedBy' })
  CareGrant.belongsTo(User, { foreignKey: { name: 'revokedByUserId', field: 'revoked_by_user_id', allowNull: true }, as: 'revokedBy' })
  CircleInvitation.belongsTo(Patient, { foreignKey: { name: 'patientId', field: 'patient_id', allowNull: false }, as: 'patient' })
  CircleInvitation.belongsTo(User, { foreignKey: { name: 'invitedByUserId', field: 'invited_by_user_id', allowNull: false }, as: 'invitedBy' })
  CircleInvitation.belongsTo(User, { foreignKey: { name: 'acceptedByUserId', field: 'accepted_by_user_id', allowNull: true }, as: 'acceptedBy' })
  CircleInvitation.belongsTo(CareGrant, { foreignKey: { name: 'grantId', field: 'grant_id', allowNull: true }, as: 'grant' })
  registerScheduleAssociations()
  registerDiaryAndTriageAssociations()
  LabResult.initModel(sequelize)
  registerLabAssociations()
  Visit.initModel(sequelize)
  VisitKit.initModel(sequelize)
  registerVisitAssociations()
  MonitoringPlan.initModel(sequelize)
  MonitoringItem.initModel(sequelize)
  registerMonitoringAssociations()
  for (const model of [MessageThread, Message, MessageRead, Attachment]) model.initModel(sequelize)
  registerMessageAssociations()
}

/** The injection schedule: regimens, injections, appointments and change requests. */
function registerScheduleAssociations() {
  const patientKey = { name: 'patientId', field: 'patient_id', allowNull: false }
  PatientRegimen.belongsTo(Regimen, { foreignKey: { name: 'regimenId', field: 'regimen_id', allowNull: false }, as: 'regimen' })
  PatientRegimen.belongsTo(Patient, { foreignKey: patientKey, as: 'patient' })
  PatientRegimen.belongsTo(User, { foreignKey: { name: 'setByUserId', field: 'set_by_user_id', allowNull: true }, as: 'setBy' })
  Injection.belongsTo(Patient, { foreignKey: patientKey, as: 'patient' })
  Injection.belongsTo(Regimen, { foreignKey: { name: 'regimenId', field: 'regimen_id', allowNull: false }, as: 'regimen' })
  Injection.belongsTo(User, { foreignKey: { name: 'givenByUserId', field: 'given_by_user_id', allowNull: false }, as: 'givenBy' })
  Appointment.belongsTo(Patient, { foreignKey: patientKey, as: 'patient' })
  Appointment.belongsTo(User, { foreignKey: { name: 'confirmedByUserId', field: 'confirmed_by_user_id', allowNull: true }, as: 'confirmedBy' })
  Appointment.belongsTo(User, { foreignKey: { name: 'createdByUserId', field: 'created_by_user_id', allowNull: true }, as: 'createdBy' })
  Appointment.belongsTo(User, { foreignKey: { name: 'cancelledByUserId', field: 'cancelled_by_user_id', allowNull: true }, as: 'cancelledBy' })
  Appointment.hasMany(AppointmentChangeRequest, { foreignKey: { name: 'appointmentId', field: 'appointment_id', allowNull: false }, as: 'changeRequests' })
  AppointmentChangeRequest.belongsTo(Appointment, { foreignKey: { name: 'appointmentId', field: 'appointment_id', allowNull: false }, as: 'appointment' })
  AppointmentChangeRequest.belongsTo(Patient, { foreignKey: patientKey, as: 'patient' })
  AppointmentChangeRequest.belongsTo(User, { foreignKey: { name: 'requestedByUserId', field: 'requested_by_user_id', allowNull: false }, as: 'requestedBy' })
  AppointmentChangeRequest.belongsTo(User, { foreignKey: { name: 'answeredByUserId', field: 'answered_by_user_id', allowNull: true }, as: 'answeredBy' })
}

function registerDiaryAndTriageAssociations() {
  Patient.hasMany(DiaryEntry, { foreignKey: { name: 'patientId', field: 'patient_id', allowNull: false }, as: 'diaryEntries' })
  DiaryEntry.belongsTo(Patient, { foreignKey: { name: 'patientId', field: 'patient_id', allowNull: false }, as: 'patient' })
  DiaryEntry.belongsTo(User, { foreignKey: { name: 'enteredByUserId', field: 'entered_by_user_id', allowNull: false }, as: 'enteredBy' })
  Patient.hasMany(TriageItem, { foreignKey: { name: 'patientId', field: 'patient_id', allowNull: false }, as: 'triageItems' })
  TriageItem.belongsTo(Patient, { foreignKey: { name: 'patientId', field: 'patient_id', allowNull: false }, as: 'patient' })
  TriageItem.belongsTo(DiaryEntry, { foreignKey: { name: 'diaryEntryId', field: 'diary_entry_id', allowNull: true }, as: 'diaryEntry' })
  DiaryEntry.hasOne(TriageItem, { foreignKey: { name: 'diaryEntryId', field: 'diary_entry_id', allowNull: true }, as: 'triageItem' })
  TriageItem.belongsTo(User, { foreignKey: { name: 'assigneeUserId', field: 'assignee_user_id', allowNull: true }, as: 'assignee' })
  TriageItem.hasMany(TriageEvent, { foreignKey: { name: 'itemId', field: 'item_id', allowNull: false }, as: 'events' })
  TriageEvent.belongsTo(TriageItem, { foreignKey: { name: 'itemId', field: 'item_id', allowNull: false }, as: 'item' })
  TriageEvent.belongsTo(User, { foreignKey: { name: 'actorUserId', field: 'actor_user_id', allowNull: true }, as: 'actor' })
}

function registerLabAssociations() {
  Patient.hasMany(LabResult, { foreignKey: { name: 'patientId', field: 'patient_id', allowNull: false }, as: 'labResults' })
  LabResult.belongsTo(Patient, { foreignKey: { name: 'patientId', field: 'patient_id', allowNull: false }, as: 'patient' })
  LabResult.belongsTo(User, { foreignKey: { name: 'enteredByUserId', field: 'entered_by_user_id', allowNull: false }, as: 'enteredBy' })
}

/** The injection visit: its patient, appointment, kits, injection and the staff who worked it. */
function registerVisitAssociations() {
  const patientKey = { name: 'patientId', field: 'patient_id', allowNull: false }
  const userKey = (name: string, allowNull: boolean) => ({ name, field: name.replace(/[A-Z]/g, c => `_${c.toLowerCase()}`), allowNull })
  Visit.belongsTo(Patient, { foreignKey: patientKey, as: 'patient' })
  Visit.belongsTo(Appointment, { foreignKey: { name: 'appointmentId', field: 'appointment_id', allowNull: true }, as: 'appointment' })
  Visit.belongsTo(Appointment, { foreignKey: { name: 'nextAppointmentId', field: 'next_appointment_id', allowNull: true }, as: 'nextAppointment' })
  Visit.belongsTo(Injection, { foreignKey: { name: 'injectionId', field: 'injection_id', allowNull: true }, as: 'injection' })
  Visit.belongsTo(TriageItem, { foreignKey: { name: 'triageItemId', field: 'triage_item_id', allowNull: true }, as: 'triageItem' })
  Visit.belongsTo(User, { foreignKey: userKey('openedByUserId', false), as: 'openedBy' })
  Visit.belongsTo(User, { foreignKey: userKey('checkedByUserId', true), as: 'checkedBy' })
  Visit.belongsTo(User, { foreignKey: userKey('closedByUserId', true), as: 'closedBy' })
  Visit.hasMany(VisitKit, { foreignKey: { name: 'visitId', field: 'visit_id', allowNull: false }, as: 'kits' })
  VisitKit.belongsTo(Visit, { foreignKey: { name: 'visitId', field: 'visit_id', allowNull: false }, as: 'visit' })
  VisitKit.belongsTo(Patient, { foreignKey: patientKey, as: 'patient' })
  VisitKit.belongsTo(Regimen, { foreignKey: { name: 'regimenId', field: 'regimen_id', allowNull: false }, as: 'regimen' })
  VisitKit.belongsTo(User, { foreignKey: userKey('inspectedByUserId', false), as: 'inspectedBy' })
}

/** The monitoring plan: its patient, owner, the regimen it was made from, and its items. */
function registerMonitoringAssociations() {
  const patientKey = { name: 'patientId', field: 'patient_id', allowNull: false }
  MonitoringPlan.belongsTo(Patient, { foreignKey: patientKey, as: 'patient' })
  MonitoringPlan.belongsTo(User, { foreignKey: { name: 'ownerUserId', field: 'owner_user_id', allowNull: false }, as: 'owner' })
  MonitoringPlan.belongsTo(Regimen, { foreignKey: { name: 'regimenId', field: 'regimen_id', allowNull: true }, as: 'regimen' })
  MonitoringPlan.hasMany(MonitoringItem, { foreignKey: { name: 'planId', field: 'plan_id', allowNull: false }, as: 'items' })
  MonitoringItem.belongsTo(MonitoringPlan, { foreignKey: { name: 'planId', field: 'plan_id', allowNull: false }, as: 'plan' })
  MonitoringItem.belongsTo(Patient, { foreignKey: patientKey, as: 'patient' })
}

/** Messages: threads per patient, their messages, who read each, and the files sent. */
function registerMessageAssociations() {
  const patientKey = { name: 'patientId', field: 'patient_id', allowNull: false }
  const threadKey = { name: 'threadId', field: 'thread_id', allowNull: false }
  const messageKey = { name: 'messageId', field: 'message_id', allowNull: false }
  MessageThread.belongsTo(Patient, { foreignKey: patientKey, as: 'patient' })
  MessageThread.belongsTo(User, { foreignKey: { name: 'startedByUserId', field: 'started_by_user_id', allowNull: false }, as: 'startedBy' })
  MessageThread.hasMany(Message, { foreignKey: threadKey, as: 'messages' })
  Message.belongsTo(MessageThread, { foreignKey: threadKey, as: 'thread' })
  Message.belongsTo(Patient, { foreignKey: patientKey, as: 'patient' })
  Message.belongsTo(User, { foreignKey: { name: 'authorUserId', field: 'author_user_id', allowNull: false }, as: 'author' })
  Message.belongsTo(User, { foreignKey: { name: 'enteredInErrorByUserId', field: 'entered_in_error_by_user_id', allowNull: true }, as: 'enteredInErrorBy' })
  Message.hasMany(MessageRead, { foreignKey: messageKey, as: 'reads' })
  MessageRead.belongsTo(Message, { foreignKey: messageKey, as: 'message' })
  MessageRead.belongsTo(User, { foreignKey: { name: 'userId', field: 'user_id', allowNull: false }, as: 'user' })
  Message.hasMany(Attachment, { foreignKey: { name: 'messageId', field: 'message_id', allowNull: true }, as: 'attachments' })
  Attachment.belongsTo(Message, { foreignKey: { name: 'messageId', field: 'message_id', allowNull: true }, as: 'message' })
  Attachment.belongsTo(Patient, { foreignKey: patientKey, as: 'patient' })
  Attachment.belongsTo(User, { foreignKey: { name: 'uploadedByUserId', field: 'uploaded_by_user_id', allowNull: false }, as: 'uploadedBy' })
  Attachment.belongsTo(LabResult, { foreignKey: { name: 'labResultId', field: 'lab_result_id', allowNull: true }, as: 'labResult' })
}

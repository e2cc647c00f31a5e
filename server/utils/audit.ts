import type { H3Event } from 'h3'
import { getRequestIP } from 'h3'
import type { Transaction } from 'sequelize'
import { AuditEvent } from '../db/models'

export interface AuditInput {
  actor: { id: number, role: string } | null
  patientId: number | null
  action: string
  resource: string
  outcome?: 'allowed' | 'denied'
}

/** Adds one line to the audit trail. */
export async function recordAudit(event: H3Event | null, input: AuditInput, transaction?: Transaction) {
  await AuditEvent.create({
    actorUserId: input.actor?.id ?? null,
    actorRole: input.actor?.role ?? null,
    patientId: input.patientId,
    action: input.action,
    resource: input.resource,
    outcome: input.outcome ?? 'allowed',
    ip: event ? (getRequestIP(event, { xForwardedFor: false }) ?? null) : null,
  }, { transaction })
}

import type { H3Event } from 'h3'
import type { Transaction } from 'sequelize'
import { AuditEvent } from '../../db/models'
import type { AuditOutcome } from '#shared/audit/outcomes'

/*
 * What happened, as the audit trail records it (DEVELOPERS.md "Audit outcomes"):
 * - `done`: the request finished with a 2xx or 3xx answer;
 * - `refused-policy`: the access policy said no (401, 403, 404), in authorizePatient or
 *   in the handler's own check of a nested record;
 * - `refused-invalid`: the input was refused (400, 413, 415, 422), nothing was done;
 * - `refused-conflict`: the record had moved on (409, 412), nothing was done;
 * - `failed`: anything else (429, 5xx, an exception): the work did not go through.
 * `allowed` only on lines written before migration 0013: access granted, outcome not recorded.
 * The values: shared/audit/outcomes.ts.
 */

/** The outcome of a request that was authorised and ended with this HTTP status. */
export function outcomeOfStatus(status: number): AuditOutcome {
  if (status >= 200 && status < 400) return 'done'
  if (status === 401 || status === 403 || status === 404) return 'refused-policy'
  if (status === 400 || status === 413 || status === 415 || status === 422) return 'refused-invalid'
  if (status === 409 || status === 412) return 'refused-conflict'
  return 'failed'
}

export interface AuditInput {
  actor: { id: number, role: string } | null
  patientId: number | null
  action: string
  resource: string
  outcome?: AuditOutcome
}

function row(event: H3Event | null, input: AuditInput) {
  return {
    actorUserId: input.actor?.id ?? null,
    actorRole: input.actor?.role ?? null,
    patientId: input.patientId,
    action: input.action,
    resource: input.resource,
    outcome: input.outcome ?? 'done',
    // The same address the throttles count (throttle.ts), the browser's during a server render.
    ip: event ? knownIp(clientIp(event)) : null,
  }
}

const knownIp = (ip: string) => (ip === 'unknown' ? null : ip)

/** Adds one line to the audit trail. */
export async function recordAudit(event: H3Event | null, input: AuditInput, transaction?: Transaction) {
  await AuditEvent.create(row(event, input), { transaction })
}

/** The most patients one list read writes lines for; a list longer than this is cut to it. */
export const AUDIT_LIST_MAX = 500

/**
 * A read that showed a list of patients (the triage queue, the roster, the due list): one
 * line per patient shown, all in one INSERT, so each patient's access history can say who
 * saw him in which list. A list that showed nobody gets one line without a patient.
 */
export async function recordListAudit(event: H3Event, input: Omit<AuditInput, 'patientId'>, patientIds: readonly number[]) {
  const shown = [...new Set(patientIds)].slice(0, AUDIT_LIST_MAX)
  if (!shown.length) return recordAudit(event, { ...input, patientId: null })
  await AuditEvent.bulkCreate(shown.map(patientId => row(event, { ...input, patientId })))
}

/** A line authorizePatient granted, written with its outcome when the request ends. */
type PendingAudit = AuditInput
const PENDING = 'tidewellAuditPending'

/** Keeps the line of a granted access until the request ends (server/plugins/00.audit-outcome.ts). */
export function deferAudit(event: H3Event, input: PendingAudit) {
  const list = (event.context[PENDING] ??= []) as PendingAudit[]
  list.push(input)
}

/** Writes the request's pending lines with the outcome of its status, once; true if any. */
export async function settleAudit(event: H3Event, status: number): Promise<boolean> {
  const list = event.context[PENDING] as PendingAudit[] | undefined
  if (!list?.length) return false
  event.context[PENDING] = []
  const outcome = outcomeOfStatus(status)
  if (list.length === 1) await recordAudit(event, { ...list[0]!, outcome })
  else await AuditEvent.bulkCreate(list.map(input => row(event, { ...input, outcome })))
  return true
}

import type { MigrationFn } from './types'

/*
 * Issue 10, reads that do little: an index for each hot query that had none. Checked with
 * EXPLAIN QUERY PLAN in tests/api/query-counts.test.ts. Already indexed before this one:
 * diary entries by (patient_id, submitted_at), appointments by (patient_id, starts_at),
 * injections by (patient_id, given_at), audit events by (patient_id, at).
 */
const INDEXES: { table: string, fields: string[], name: string }[] = [
  // The audit page filtered by action (newest first) and its list of actions.
  { table: 'audit_events', fields: ['action', 'at'], name: 'audit_events_action_at' },
  // A patient's care circle: caregiver contacts on the triage item, the circle page.
  { table: 'care_grants', fields: ['patient_id', 'revoked_at'], name: 'care_grants_patient_revoked' },
  // The queue: "assigned to me", and one level in a status by respond-by time.
  { table: 'triage_items', fields: ['assignee_user_id', 'status'], name: 'triage_items_assignee_status' },
  { table: 'triage_items', fields: ['status', 'level', 'respond_by'], name: 'triage_items_status_level_respond_by' },
]

export const up: MigrationFn = async ({ context: qi }) => {
  for (const { table, fields, name } of INDEXES) await qi.addIndex(table, fields, { name })
}

export const down: MigrationFn = async ({ context: qi }) => {
  for (const { table, name } of [...INDEXES].reverse()) await qi.removeIndex(table, name)
}

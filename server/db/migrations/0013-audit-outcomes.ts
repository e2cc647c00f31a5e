import type { MigrationFn } from './types'

/*
 * Issue 11, the audit trail records what happened rather than what was allowed
 * (server/utils/audit/audit.ts, AUDIT_OUTCOMES): a line of an access now says `done`,
 * `refused-policy`, `refused-invalid`, `refused-conflict` or `failed`, written when the
 * request has finished (server/plugins/00.audit-outcome.ts).
 * - The old `denied` lines were refusals by the access policy: they become `refused-policy`.
 * - The old `allowed` lines stay `allowed`: they were written when the access was granted,
 *   before the handler ran, so whether the work was done is not known. The pages show them
 *   as "allowed (outcome not recorded)"; the patient's access history counts them as before.
 * New lines always name their outcome (the model's default is `done`).
 */
export const up: MigrationFn = async ({ context: qi }) => {
  await qi.sequelize.query(`UPDATE audit_events SET outcome = 'refused-policy' WHERE outcome = 'denied'`)
}

export const down: MigrationFn = async ({ context: qi }) => {
  await qi.sequelize.query(`UPDATE audit_events SET outcome = 'denied' WHERE outcome = 'refused-policy'`)
  await qi.sequelize.query(`UPDATE audit_events SET outcome = 'allowed' WHERE outcome IN ('done', 'refused-invalid', 'refused-conflict', 'failed')`)
}

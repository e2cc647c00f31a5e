/**
 * What happened, as the audit trail records it (server/utils/audit/audit.ts, DEVELOPERS.md
 * "Audit outcomes"). `allowed` is only on lines written before migration 0013: the access
 * was granted, its outcome was not recorded.
 */
export const AUDIT_OUTCOMES = ['done', 'refused-policy', 'refused-invalid', 'refused-conflict', 'failed'] as const
export type AuditOutcome = (typeof AUDIT_OUTCOMES)[number]
export const STORED_AUDIT_OUTCOMES = [...AUDIT_OUTCOMES, 'allowed'] as const
export type StoredAuditOutcome = (typeof STORED_AUDIT_OUTCOMES)[number]

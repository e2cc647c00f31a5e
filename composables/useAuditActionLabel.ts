/**
 * Words for an audit action code (patient.read -> "Opened the record"). Codes added later
 * without words fall back to "Looked at the record" (*.read) or "Changed the record".
 */
export function useAuditActionLabel() {
  const { t, te } = useI18n()
  function label(action: string): string {
    const key = `audit.actions.${action.replace(/[.-]/g, '_')}`
    if (te(key)) return t(key)
    return t(action.endsWith('.read') ? 'audit.actions.otherRead' : 'audit.actions.other')
  }
  return { label }
}

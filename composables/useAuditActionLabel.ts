/**
 * Words for an audit action code (patient.read -> "Opened the record"). A look under an
 * action named for a change (reading free slots needs appointment.schedule) and codes added
 * later without words fall back to "Looked at the record" or "Changed the record".
 */
export function useAuditActionLabel() {
  const { t, te } = useI18n()
  function label(action: string, kind?: 'viewed' | 'changed'): string {
    const key = `audit.actions.${action.replace(/[.-]/g, '_')}`
    const looked = kind ? kind === 'viewed' : action.endsWith('.read')
    if (te(key) && looked === action.endsWith('.read')) return t(key)
    return t(looked ? 'audit.actions.otherRead' : 'audit.actions.other')
  }
  return { label }
}

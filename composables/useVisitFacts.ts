import type { WindowCheck } from '#shared/visit/rules'
import type { VisitKitView, VisitView } from '#shared/visit/views'

/** One recorded fact: its term, its value in words, and a test id where a test reads it. */
export interface VisitFact { term: string, value: string, testId?: string }

/**
 * The visit in words, as lists of facts (VisitFacts) the steps show before and after they are
 * recorded: who he is, where today falls against his window with his last and suggested
 * site, the checks, a kit, and the dose given.
 */
export function useVisitFacts(visit: () => VisitView) {
  const { t } = useI18n()
  const { day, site, every, camel, regimen: regimenName } = useScheduleFormat()
  const { instant } = useClinicTime()
  const yes = (value: boolean) => t(value ? 'visit.yes' : 'visit.no')

  function windowText(check: WindowCheck) {
    if (check.position === 'early' || check.position === 'late') return t(`visit.window.${check.position}`, { n: check.days }, check.days)
    if (check.position === 'first-dose' || check.daysFromDue === null) return t('visit.window.firstDose')
    if (check.daysFromDue === 0) return t('visit.window.dueToday')
    const n = Math.abs(check.daysFromDue)
    return t(check.daysFromDue < 0 ? 'visit.window.insideBefore' : 'visit.window.insideAfter', { n }, n)
  }

  const person = computed<VisitFact[]>(() => {
    const { patient } = visit()
    return [
      { term: t('staff.name'), value: patient.name, testId: 'visit-name' },
      { term: t('staff.dateOfBirth'), value: day(patient.dateOfBirth), testId: 'visit-dob' },
      { term: t('staff.clinicNumber'), value: patient.clinicNumber },
    ]
  })

  const window = computed<VisitFact[]>(() => {
    const { regimen, lastInjection, suggestedSite, window: check } = visit()
    return [
      { term: t('visit.facts.regimen'), value: regimen ? `${regimenName(regimen.name)} (${every(regimen.intervalDays)})` : t('visit.facts.none') },
      { term: t('visit.facts.window'), value: windowText(check), testId: 'visit-window' },
      { term: t('visit.facts.lastInjection'), value: lastInjection ? `${day(lastInjection.date)} · ${site(lastInjection.site)}` : t('visit.facts.none') },
      { term: t('visit.facts.suggestedSite'), value: site(suggestedSite), testId: 'visit-suggested-site' },
    ]
  })

  const checks = computed<VisitFact[]>(() => {
    const { checks: recorded, window: check } = visit()
    if (!recorded) return []
    return [
      { term: t('visit.facts.identity'), value: t('visit.facts.identityConfirmed') },
      { term: t('visit.facts.hypersensitivity'), value: yes(recorded.hypersensitivity) },
      { term: t('visit.facts.rightNow'), value: recorded.rightNow.length ? recorded.rightNow.map(item => t(`diary.rightNow.items.${item}`)).join(' ') : t('visit.facts.rightNowNone') },
      { term: t('visit.facts.window'), value: windowText(check) },
      ...(recorded.windowReason ? [{ term: t('visit.facts.windowReason'), value: recorded.windowReason }] : []),
    ]
  })

  function kit(recorded: VisitKitView): VisitFact[] {
    return [
      { term: t('visit.facts.lot'), value: recorded.lotNumber, testId: 'visit-kit-lot' },
      { term: t('visit.facts.expiry'), value: day(recorded.lotExpiresOn) },
      ...(recorded.gtin ? [{ term: t('visit.facts.gtin'), value: recorded.gtin }] : []),
      { term: t('visit.facts.regimen'), value: regimenName(recorded.regimen.name) },
      { term: t('visit.facts.powder'), value: t(recorded.powderOk ? 'visit.kit.powderOk' : 'visit.kit.powderBad') },
      { term: t('visit.facts.diluent'), value: t(recorded.diluentOk ? 'visit.kit.diluentOk' : 'visit.kit.diluentBad') },
      ...(recorded.mixedAt ? [{ term: t('visit.facts.mixedAt'), value: instant(recorded.mixedAt, 'time') }] : []),
      { term: t('visit.facts.kitStatus'), value: t(`visit.kitStatus.${recorded.status}`) + (recorded.wasteReason ? ` (${t(`visit.wasteReasons.${camel(recorded.wasteReason)}`)})` : '') },
    ]
  }

  const given = computed<VisitFact[]>(() => {
    const { injection, mixGapMinutes, mixLimitMinutes } = visit()
    if (!injection) return []
    return [
      { term: t('visit.facts.givenAt'), value: instant(injection.givenAt, 'time'), testId: 'visit-given-at' },
      { term: t('visit.facts.site'), value: site(injection.site), testId: 'visit-given-site' },
      { term: t('visit.facts.lot'), value: injection.lotNumber },
      ...(mixGapMinutes !== null ? [{ term: t('visit.facts.mixGap'), value: t('visit.facts.minutes', { n: mixGapMinutes, limit: mixLimitMinutes }, mixGapMinutes) }] : []),
    ]
  })

  return reactive({ person, window, checks, given, kit, windowText })
}

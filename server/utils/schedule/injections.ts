import type { Injection } from '../../db/models'
import type { InjectionView } from '#shared/schedule/views'

/** One injection as the pages see it (regimen and givenBy included by the query). */
export function shapeInjection(injection: Injection): InjectionView {
  return {
    id: injection.id,
    givenAt: injection.givenAt.toISOString(),
    givenOn: injection.givenOn,
    site: injection.site,
    lotNumber: injection.lotNumber,
    lotExpiresOn: injection.lotExpiresOn,
    regimen: { id: injection.regimen?.id ?? injection.regimenId, name: injection.regimen?.name ?? '' },
    givenBy: injection.givenBy?.name ?? '',
    note: injection.note,
  }
}

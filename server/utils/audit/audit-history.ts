import { IANAZone } from 'luxon'
import { QueryTypes } from 'sequelize'

/*
 * The patient's access history, grouped in SQL: one line per person, per day in the
 * clinic's time zone, per kind (read, change, refused), with a count. Lines of the patient
 * himself and refusals by the access policy are left out (admins see those in the trail);
 * a request that was authorised but refused as invalid, in conflict or failed is `refused`,
 * never a change.
 */
export type HistoryKind = 'read' | 'change' | 'refused'

export const HISTORY_PAGE_SIZE = 30

const HOUR = 3600_000
/** The offsets of a zone from 2020 until a year from now: [start in ms, offset in minutes]. */
const segmentsByZone = new Map<string, { until: number, segments: [number, number][] }>()

function zoneSegments(timeZone: string): [number, number][] {
  const cached = segmentsByZone.get(timeZone)
  if (cached && cached.until > Date.now()) return cached.segments
  const zone = IANAZone.create(timeZone)
  const offset = (ms: number) => (zone.isValid ? zone.offset(ms) : 0)
  const start = Date.UTC(2020, 0, 1)
  const end = Date.now() + 366 * 24 * HOUR
  const segments: [number, number][] = [[start, offset(start)]]
  for (let ms = start + 6 * HOUR; ms <= end; ms += 6 * HOUR) {
    const last = segments[segments.length - 1]![1]
    if (offset(ms) === last) continue
    // The change is in the last six hours: find its minute.
    let low = ms - 6 * HOUR
    let high = ms
    while (high - low > 60_000) {
      const mid = low + Math.floor((high - low) / 2 / 60_000) * 60_000
      if (offset(mid) === last) low = mid
      else high = mid
    }
    segments.push([high, offset(high)])
  }
  segmentsByZone.set(timeZone, { until: end - 180 * 24 * HOUR, segments })
  return segments
}

/** Stored times look like '2026-03-08 04:30:00.000 +00:00' and compare as text. */
const stamp = (ms: number) => new Date(ms).toISOString().replace('T', ' ').replace('Z', '')

/** SQL for the clinic's date of the column `at` (SQLite knows no time zones, so the offsets go in). */
export function clinicDaySql(timeZone: string, column = 'at'): string {
  return sqlDayIn(timeZone, column, () => sqliteClinicDay(timeZone, column))
}

function sqliteClinicDay(timeZone: string, column: string): string {
  const segments = zoneSegments(timeZone)
  const modifier = (minutes: number) => `'${Math.trunc(minutes)} minutes'`
  const cases = segments.slice(1).reverse().map(([from, minutes]) => `WHEN ${column} >= '${stamp(from)}' THEN ${modifier(minutes)}`)
  const first = modifier(segments[0]![1])
  return cases.length ? `date(${column}, CASE ${cases.join(' ')} ELSE ${first} END)` : `date(${column}, ${first})`
}

/** read, change or refused, as auditKind() tells a look from a change, in SQL. */
const kindSql = () => `CASE
  WHEN outcome NOT IN ('done', 'allowed') THEN 'refused'
  WHEN ${sqlGlob('resource', '[A-Z]* /*')} THEN (CASE WHEN ${sqlGlob('resource', 'GET /*')} OR ${sqlGlob('resource', 'HEAD /*')} THEN 'read' ELSE 'change' END)
  WHEN ${sqlGlob('action', '*.read')} THEN 'read'
  ELSE 'change' END`

export interface HistoryGroup {
  actorUserId: number | null
  actorRole: string | null
  day: string
  kind: HistoryKind
  count: number
  firstAt: string
  lastAt: string
  actions: string[]
}

export async function accessHistory(patientId: number, patientUserId: number, timeZone: string, page: number) {
  const sequelize = await useDb()
  const from = `FROM audit_events
    WHERE patient_id = :patientId AND (actor_user_id IS NULL OR actor_user_id <> :self) AND outcome <> 'refused-policy'
    GROUP BY actor_user_id, actor_role, day, kind`
  const select = `SELECT actor_user_id AS "actorUserId", actor_role AS "actorRole", ${clinicDaySql(timeZone)} AS day, ${kindSql()} AS kind`
  const replacements = { patientId, self: patientUserId, limit: HISTORY_PAGE_SIZE, offset: (page - 1) * HISTORY_PAGE_SIZE }
  const [rows, totals] = await Promise.all([
    sequelize.query<Omit<HistoryGroup, 'actions'> & { actions: string }>(
      `${select}, COUNT(*) AS count, MIN(at) AS "firstAt", MAX(at) AS "lastAt", ${sqlDistinctList('action')} AS actions ${from}
       ORDER BY day DESC, MAX(id) DESC LIMIT :limit OFFSET :offset`,
      { replacements, type: QueryTypes.SELECT },
    ),
    sequelize.query<{ total: number }>(`SELECT COUNT(*) AS total FROM (${select} ${from}) AS g`, { replacements, type: QueryTypes.SELECT }),
  ])
  return {
    total: Number(totals[0]?.total ?? 0),
    groups: rows.map(r => ({ ...r, count: Number(r.count), actions: String(r.actions ?? '').split(',').filter(Boolean).sort() })) as HistoryGroup[],
  }
}

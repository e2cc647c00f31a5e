import type { Sequelize, Transaction } from 'sequelize'
import { diaryEntryWith } from '#shared/diary/schemas'
import type { Disposition, TriageEventType } from '#shared/triage/schemas'
import { Patient, TriageEvent, User } from '../models'
import type { TriageItem } from '../models'
import { runSeedSteps } from './demo'
import type { SeedStep } from './demo'

/**
 * Demo activity for `npm run demo` only (NUXT_SEED_DEMO_ACTIVITY): a few weeks of invented
 * diary entries, triaged by the real engine, so the triage queue has work in it. The test
 * suites seed the clinic without this, so their patients start with empty diaries.
 */
const DAY = 86_400_000

type Changes = Parameters<typeof diaryEntryWith>[0]

interface StoryLine {
  clinicNumber: string
  /** Days ago, oldest first. */
  entries: [daysAgo: number, changes: Changes][]
  /** What the care team already did about the newest entry's queue item. */
  handledBy?: { nurse: string, events: TriageEventType[], disposition?: Disposition, close?: boolean }
}

const mildFlushes = { hotFlushes: { perDay: 3, worstSeverity: 'mild', interference: 'none' } } as const

const STORIES: StoryLine[] = [
  // Elias: steady weeks of mild hot flushes.
  { clinicNumber: 'LPU-1001', entries: [[29, mildFlushes], [22, mildFlushes], [15, mildFlushes], [8, { ...mildFlushes, fatigue: 'eased-by-rest' }]] },
  // Odell: new back pain that wakes him and is worse on coughing (NICE NG234 pattern): urgent, waiting.
  {
    clinicNumber: 'LPU-1004',
    entries: [[16, mildFlushes], [9, { pain: { worst: 2, locations: ['hips'] } }], [0.1, { pain: { worst: 6, locations: ['back'], newOrWorse: true, wakesAtNight: true, worseOnStraining: true } }]],
  },
  // Ramón: blood in the urine: urgent, a nurse is on it.
  {
    clinicNumber: 'LPU-1007',
    entries: [[14, mildFlushes], [0.2, { urinary: { blood: true } }]],
    handledBy: { nurse: 'nurse@demo.tidewell.test', events: ['claimed', 'call-attempted'] },
  },
  // Desmond: low mood two weeks running: routine review.
  { clinicNumber: 'LPU-1009', entries: [[7, { mood: { phq2Interest: 1, phq2Down: 1 } }], [1, { mood: { phq2Interest: 2, phq2Down: 2 } }]] },
  // Cyril: sudden leg weakness last week: emergency, sent to emergency care, closed.
  {
    clinicNumber: 'LPU-1008',
    entries: [[20, mildFlushes], [6, { rightNow: { newWeakness: true, troubleWalking: true } }]],
    handledBy: { nurse: 'nurse2@demo.tidewell.test', events: ['claimed', 'call-reached'], disposition: 'sent-to-emergency', close: true },
  },
]

const diaryStory: SeedStep = async (transaction: Transaction) => {
  const now = Date.now()
  for (const story of STORIES) {
    const patient = await Patient.findOne({ where: { clinicNumber: story.clinicNumber }, transaction })
    if (!patient) continue
    let lastItem: TriageItem | null = null
    for (const [daysAgo, changes] of story.entries) {
      const { entry } = await storeDiaryEntry({ patient, enteredBy: { id: patient.userId }, answers: diaryEntryWith(changes), submittedAt: new Date(now - daysAgo * DAY) }, transaction)
      lastItem = await openTriageItemForEntry(entry, transaction) ?? lastItem
    }
    if (!story.handledBy || !lastItem) continue
    const nurse = await User.findOne({ where: { email: story.handledBy.nurse }, transaction })
    let at = lastItem.createdAt.getTime() + 20 * 60_000
    for (const type of story.handledBy.events) {
      await TriageEvent.create({ itemId: lastItem.id, actorUserId: nurse!.id, type, note: null, at: new Date(at) }, { transaction })
      at += 15 * 60_000
    }
    if (story.handledBy.disposition) {
      await TriageEvent.create({ itemId: lastItem.id, actorUserId: nurse!.id, type: 'disposition-set', note: null, data: { disposition: story.handledBy.disposition }, at: new Date(at) }, { transaction })
    }
    if (story.handledBy.close) {
      await TriageEvent.create({ itemId: lastItem.id, actorUserId: nurse!.id, type: 'closed', note: null, at: new Date(at + 60_000) }, { transaction })
    }
    await lastItem.update({
      assigneeUserId: nurse!.id,
      status: story.handledBy.close ? 'closed' : 'in-progress',
      disposition: story.handledBy.disposition ?? null,
      closedAt: story.handledBy.close ? new Date(at + 60_000) : null,
    }, { transaction })
  }
}

/** The diary story once, then what the daily overdue sweep would find today (once per cycle). */
export async function seedDemoActivity(sequelize: Sequelize) {
  await runSeedSteps(sequelize, [['activity', diaryStory]])
  await openOverdueInjectionItems(new Date())
}

import { format } from 'date-fns'
import { defineStore } from 'pinia'
import { computed } from 'vue'
import type { InstrumentId } from '@shared/content/measureForms'
import { measureBundle } from '@shared/fhir/measureBundle'
import type { Entry } from '@shared/schemas/entry.schema'
import { measureBodySchema, type ItemAnswer, type MeasureBody, type MeasureResult } from '@shared/schemas/measure.schema'
import { measureResultOfEarlierScore, measureResultOfEntry } from '@shared/scoring/measureResults'
import { fetchEarlierScores } from '@/api/earlierScores'
import { useLiveQuery } from '@/composables/useLiveQuery'
import { listEarlierScores, saveEarlierScores } from '@/db/earlierScoresRepository'
import { getEntry } from '@/db/entriesRepository'
import { listStoredLinks } from '@/db/linksRepository'
import { listMeasureEntries } from '@/db/measuresRepository'
import type { StoredEarlierScore } from '@/db/RungsDB'
import { useEntriesStore } from './entries'
import { useSessionStore } from './session'

/** What the form has so far; `completedAt` is set when the person reaches the end. */
export interface MeasureProgress {
  answers: ItemAnswer[]
  difficulty?: 0 | 1 | 2 | 3
  completedAt?: number
}

/** Saves one questionnaire as the person answers: the entry is created on the first save and updated after each. */
export interface MeasureSaver {
  save(progress: MeasureProgress): Promise<string>
  readonly id: string | undefined
}

/** The person's questionnaires on this device, earlier scores from their therapist, and the write path of the form. */
export const useMeasuresStore = defineStore('measures', () => {
  const entries = useEntriesStore()
  const session = useSessionStore()
  const { result: measureEntries, loaded } = useLiveQuery(() => listMeasureEntries(), [] as Entry[])
  const { result: earlierScores } = useLiveQuery(() => listEarlierScores(), [] as StoredEarlierScore[])

  /** Finished forms (scored or not) and the therapist's earlier scores, one list for history, charts and export. */
  const results = computed<MeasureResult[]>(() => [
    ...measureEntries.value.map(measureResultOfEntry).filter((r): r is MeasureResult => r !== null),
    ...earlierScores.value.map(measureResultOfEarlierScore),
  ])
  /** Forms started and not finished, newest first, to resume or delete. */
  const unfinished = computed(() => measureEntries.value.filter((e) => e.measure && e.measure.completedAt === undefined).reverse())

  /**
   * Fetches the therapist's earlier scores, only when signed in as a person with an active link: a device that never
   * signed in makes no request (DESIGN.md, Who-am-I). Failures keep the cached copy.
   */
  async function refreshEarlierScores(): Promise<void> {
    await session.ready()
    if (session.status !== 'signedIn' || session.role !== 'person') return
    const active = (await listStoredLinks()).filter((l) => l.state === 'active')
    for (const link of active) {
      const { scores } = await fetchEarlierScores(link.id)
      await saveEarlierScores(link.id, scores)
    }
  }

  function saver(instrument: InstrumentId, startedAt: number, existingId?: string): MeasureSaver {
    let id = existingId
    let chain: Promise<unknown> = Promise.resolve()
    return {
      get id() {
        return id
      },
      save(progress) {
        // Never-chosen values stay absent rather than stored as undefined.
        const measure: MeasureBody = measureBodySchema.parse({
          instrument,
          answers: progress.answers,
          ...(progress.difficulty !== undefined ? { difficulty: progress.difficulty } : {}),
          ...(progress.completedAt !== undefined ? { completedAt: progress.completedAt } : {}),
        })
        // One write at a time, so quick taps never create the entry twice.
        const next = chain.then(async () => {
          if (id) await entries.update(id, { measure })
          else id = (await entries.create({ kind: 'measure', body: '', wants: [], backgroundThoughts: [], tags: [], createdAt: startedAt, measure })).id
          return id
        })
        chain = next.catch(() => undefined)
        return next
      },
    }
  }

  async function getMeasureEntry(id: string): Promise<Entry | undefined> {
    const e = await getEntry(id)
    return e?.kind === 'measure' ? e : undefined
  }

  /** A FHIR R4 Bundle of every finished result, built on the device; nothing is sent anywhere. */
  function fhirFile(now = new Date()): { name: string; type: string; text: string } {
    const bundle = measureBundle(results.value, { generatedAt: now })
    return { name: `rungs-measures-${format(now, 'yyyy-MM-dd')}.json`, type: 'application/fhir+json', text: JSON.stringify(bundle, null, 2) }
  }

  return { entries: measureEntries, loaded, earlierScores, results, unfinished, refreshEarlierScores, saver, getMeasureEntry, remove: entries.remove, fhirFile }
})

import type { InstrumentId } from '@shared/content/measureForms'
import { endOfDay, format, isValid, parseISO, startOfDay, subDays } from 'date-fns'
import { defineStore } from 'pinia'
import { computed, ref, shallowRef } from 'vue'
import type { Entry } from '@shared/schemas/entry.schema'
import type { MeasureResult } from '@shared/schemas/measure.schema'
import { safetyPlanSections } from '@shared/content/safetyPlanSections'
import { measureResultOfEarlierScore, measureResultOfEntry, scoredSeries } from '@shared/scoring/measureResults'
import { listEarlierScores } from '@/db/earlierScoresRepository'
import { entriesBetween } from '@/db/entriesRepository'
import { listStoredLinks } from '@/db/linksRepository'
import { listMeasureEntries } from '@/db/measuresRepository'
import { getSafetyPlanEntry } from '@/db/safetyPlanRepository'
import { readBringUp, writeBringUp } from '@/db/summaryPrefsRepository'
import type { SafetyPlanSection, SummaryInput } from '@/pdf/buildSummaryPdf'
import type { PageSize } from '@/pdf/summaryLayout'

export type SummaryPreset = 'lastSession' | '14d' | '30d' | '90d' | 'custom'

export const presetLabels: Record<SummaryPreset, string> = {
  lastSession: 'Since the last session',
  '14d': 'Last 2 weeks',
  '30d': 'Last 30 days',
  '90d': 'Last 90 days',
  custom: 'Choose dates',
}

const DEFAULT_DAYS = 14
const isoDay = (t: number) => format(t, 'yyyy-MM-dd')

/** Letter where it is the usual paper (US and Canada), A4 elsewhere. */
export function defaultPageSize(locale = typeof navigator === 'undefined' ? 'en' : navigator.language): PageSize {
  return /^[a-z]{2,3}-(US|CA)\b/i.test(locale) ? 'Letter' : 'A4'
}

/** Gathers what the appointment summary can hold, keeps the person's choices, and builds the PDF on the device. */
export const useSummaryStore = defineStore('summary', () => {
  const preset = ref<SummaryPreset>('lastSession')
  const customFrom = ref(isoDay(subDays(Date.now(), DEFAULT_DAYS - 1).getTime()))
  const customTo = ref(isoDay(Date.now()))
  const pageSize = ref<PageSize>(defaultPageSize())
  const lastSessionAt = ref<number | null>(null)
  const entries = shallowRef<Entry[]>([])
  const measures = shallowRef<MeasureResult[]>([])
  const firstScores = shallowRef<Partial<Record<InstrumentId, MeasureResult>>>({})
  const chosenEntries = ref<string[]>([])
  const chosenMeasures = ref<string[]>([])
  const bringUp = ref<string[]>([])
  const safetyPlan = shallowRef<SafetyPlanSection[] | null>(null)
  const includeSafetyPlan = ref(false)
  const loading = ref(false)
  const building = ref(false)
  const progress = ref({ fraction: 0, label: '' })

  /** The period's bounds and how it was chosen; "since the last session" falls back to 14 days, and says so. */
  const period = computed(() => {
    const now = Date.now()
    const to = endOfDay(now).getTime()
    const days = (n: number) => startOfDay(subDays(now, n - 1)).getTime()
    if (preset.value === 'lastSession') {
      if (lastSessionAt.value !== null) return { from: lastSessionAt.value, to, label: presetLabels.lastSession, note: null }
      return { from: days(DEFAULT_DAYS), to, label: 'Last 2 weeks', note: 'No past session is recorded on this device, so the summary covers the last 14 days.' }
    }
    if (preset.value === 'custom') {
      const from = parseISO(customFrom.value)
      const until = parseISO(customTo.value)
      if (!isValid(from) || !isValid(until)) return { from: days(DEFAULT_DAYS), to, label: 'Last 2 weeks', note: 'Those dates could not be read; showing the last 14 days.' }
      const [a, b] = from <= until ? [from, until] : [until, from]
      return { from: startOfDay(a).getTime(), to: endOfDay(b).getTime(), label: 'Chosen dates', note: null }
    }
    const n = preset.value === '14d' ? 14 : preset.value === '30d' ? 30 : 90
    return { from: days(n), to, label: presetLabels[preset.value], note: null }
  })

  const moments = computed(() => entries.value.filter((e) => e.kind === 'moment'))
  const tugs = computed(() => entries.value.filter((e) => e.kind === 'tug'))
  const hasSafetyPlan = computed(() => (safetyPlan.value?.length ?? 0) > 0)

  /** The latest past session over the person's links, from the device's copy of them (so it works offline). */
  async function readLastSession(): Promise<number | null> {
    const times = (await listStoredLinks()).map((l) => (l.lastSessionAt ? Date.parse(l.lastSessionAt) : NaN)).filter((t) => !Number.isNaN(t) && t <= Date.now())
    return times.length ? Math.max(...times) : null
  }

  /** What falls in the period; everything ticked, as the person starts from "all of it". */
  async function loadPeriod(): Promise<void> {
    const { from, to } = period.value
    const [inRange, measureEntries, earlier] = await Promise.all([entriesBetween(from, to), listMeasureEntries(), listEarlierScores()])
    entries.value = inRange.filter((e) => e.kind === 'moment' || e.kind === 'tug').sort((a, b) => b.createdAt - a.createdAt)
    // The person's own questionnaires and the earlier scores their therapist entered (cached on the device).
    const all = [...measureEntries.map(measureResultOfEntry), ...earlier.map(measureResultOfEarlierScore)].filter((r): r is MeasureResult => r !== null)
    // Change counts from the true first score, which may be an intake score from before the period.
    firstScores.value = Object.fromEntries((['phq9', 'gad7'] as const).flatMap((m) => scoredSeries(all, m).slice(0, 1).map((r) => [m, r])))
    measures.value = all.filter((r) => Date.parse(r.takenAt) >= from && Date.parse(r.takenAt) <= to).sort((a, b) => a.takenAt.localeCompare(b.takenAt))
    chosenEntries.value = entries.value.map((e) => e.id)
    chosenMeasures.value = measures.value.map((m) => m.id)
  }

  async function load(): Promise<void> {
    loading.value = true
    try {
      const [last, items, planEntry] = await Promise.all([readLastSession(), readBringUp(), getSafetyPlanEntry()])
      lastSessionAt.value = last
      bringUp.value = items
      // Steps not filled in yet are left out of the PDF.
      safetyPlan.value = planEntry?.safetyPlan ? safetyPlanSections(planEntry.safetyPlan).filter((s) => s.lines.length).map(({ title, lines }) => ({ title, lines })) : null
      if (!hasSafetyPlan.value) includeSafetyPlan.value = false
      await loadPeriod()
    } finally {
      loading.value = false
    }
  }

  async function setBringUp(items: string[]): Promise<void> {
    bringUp.value = items
    await writeBringUp(items)
  }

  function chooseAllEntries(all: boolean): void {
    chosenEntries.value = all ? entries.value.map((e) => e.id) : []
  }

  function summaryInput(now = Date.now()): SummaryInput {
    const ids = new Set(chosenEntries.value)
    const mids = new Set(chosenMeasures.value)
    return {
      from: period.value.from,
      to: Math.min(period.value.to, endOfDay(now).getTime()),
      periodLabel: period.value.label,
      pageSize: pageSize.value,
      entries: entries.value.filter((e) => ids.has(e.id)),
      measures: measures.value.filter((m) => mids.has(m.id)),
      firstScores: firstScores.value,
      bringUp: bringUp.value.filter((s) => s.trim()),
      safetyPlan: includeSafetyPlan.value && hasSafetyPlan.value ? safetyPlan.value : null,
      generatedAt: now,
    }
  }

  /** Builds the PDF here on the device (pdf-lib loaded only now) and returns it with its file name. */
  async function make(): Promise<{ bytes: Uint8Array; fileName: string }> {
    building.value = true
    progress.value = { fraction: 0, label: 'Starting' }
    try {
      const input = summaryInput()
      const { makeSummaryPdf } = await import('@/pdf/makeSummaryPdf')
      const bytes = await makeSummaryPdf(input, (fraction, label) => {
        progress.value = { fraction, label }
      })
      return { bytes, fileName: `rungs-summary-${isoDay(input.generatedAt)}.pdf` }
    } finally {
      building.value = false
    }
  }

  return {
    preset,
    customFrom,
    customTo,
    pageSize,
    lastSessionAt,
    period,
    entries,
    moments,
    tugs,
    measures,
    chosenEntries,
    chosenMeasures,
    bringUp,
    safetyPlan,
    hasSafetyPlan,
    includeSafetyPlan,
    loading,
    building,
    progress,
    load,
    loadPeriod,
    setBringUp,
    chooseAllEntries,
    summaryInput,
    make,
  }
})

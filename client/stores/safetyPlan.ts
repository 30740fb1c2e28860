import { defineStore } from 'pinia'
import { computed } from 'vue'
import { helpNowContacts, safetyPlanSteps, type SafetyPlanContact } from '@shared/content/safetyPlanSections'
import type { Entry } from '@shared/schemas/entry.schema'
import { emptySafetyPlan, safetyPlanSchema, type SafetyPlan } from '@shared/schemas/safetyPlan.schema'
import { useLiveQuery } from '@/composables/useLiveQuery'
import { readDraft } from '@/db/draftsRepository'
import type { Draft } from '@/db/RungsDB'
import { getSafetyPlanEntry, SAFETY_PLAN_DRAFT_ID } from '@/db/safetyPlanRepository'
import { useDeviceSettingsStore } from './deviceSettings'
import { useEntriesStore } from './entries'

/** Drops blank lines and blank contacts, and trims what is left, so an empty row never reaches the saved plan. */
export function tidySafetyPlan(plan: SafetyPlan): SafetyPlan {
  const lines = (l: string[]) => l.map((x) => x.trim()).filter(Boolean)
  const contacts = (cs: SafetyPlanContact[]) =>
    cs
      .map((c) => ({ name: c.name.trim(), ...(c.phone?.trim() ? { phone: c.phone.trim() } : {}), ...(c.note?.trim() ? { note: c.note.trim() } : {}) }))
      .filter((c) => c.name || c.phone || c.note)
  return {
    warningSigns: lines(plan.warningSigns),
    onMyOwn: lines(plan.onMyOwn),
    peopleAndPlaces: lines(plan.peopleAndPlaces),
    askForHelp: contacts(plan.askForHelp),
    professionals: contacts(plan.professionals),
    saferSurroundings: lines(plan.saferSurroundings),
    reasonToKeepGoing: plan.reasonToKeepGoing.trim(),
  }
}

const fieldWords: Record<string, string> = { name: 'name', phone: 'phone number', note: 'note' }

interface PlanIssue { path: PropertyKey[]; message: string; code: string; maximum?: unknown; origin?: unknown }

function problemText(issue: PlanIssue): string {
  const [key, index, field] = issue.path
  const title = safetyPlanSteps.find((s) => s.key === key)?.title ?? 'Your plan'
  const where = typeof index === 'number' ? `${title}, ${typeof field === 'string' ? `contact ${index + 1}` : `line ${index + 1}`}` : title
  if (issue.code === 'too_big' && issue.origin === 'array') return `${title}: at most ${String(issue.maximum)} here. Please remove some.`
  if (issue.code === 'too_big' && typeof field === 'string') return `${where}: the ${fieldWords[field] ?? field} can be at most ${String(issue.maximum)} characters.`
  if (issue.code === 'too_big' && key === 'reasonToKeepGoing') return `${where}: this can be at most ${String(issue.maximum)} characters.`
  if (issue.code === 'too_big') return `${where}: ${issue.message}`
  return `${where}: please check this.`
}

/** What stops the plan from being saved, in plain words naming the step and line; empty when it can be saved. */
export function safetyPlanProblems(plan: SafetyPlan): string[] {
  const tidy = tidySafetyPlan(plan)
  const r = safetyPlanSchema.safeParse(tidy)
  const problems = r.success ? [] : r.error.issues.map((i) => problemText(i as PlanIssue))
  tidy.askForHelp.concat(tidy.professionals).forEach((c) => {
    if (!c.name) problems.push(`A contact with ${c.phone ? `the number ${c.phone}` : 'a note'} needs a name.`)
  })
  return problems
}

/** The person's safety plan: one entry of kind 'safetyPlan' on this device, read and saved here. */
export const useSafetyPlanStore = defineStore('safetyPlan', () => {
  const { result: entry, loaded } = useLiveQuery(() => getSafetyPlanEntry(), undefined as Entry | undefined)
  const { result: draft } = useLiveQuery(() => readDraft(SAFETY_PLAN_DRAFT_ID), undefined as Draft | undefined)
  const plan = computed(() => entry.value?.safetyPlan)
  const settings = useDeviceSettingsStore()
  // Saves run one after another, so two quick taps never create two plans.
  let chain: Promise<unknown> = Promise.resolve()

  /** What a new plan starts with: empty steps, and Help now's lines for this device's region. */
  function freshPlan(): SafetyPlan {
    return { ...emptySafetyPlan(), professionals: helpNowContacts(settings.region) }
  }

  /** Creates the plan the first time and updates it after (its version rises, and a shared copy follows). */
  function save(next: SafetyPlan): Promise<Entry> {
    const run = chain.then(async () => {
      const problems = safetyPlanProblems(next)
      if (problems.length) throw new Error(problems.join(' '))
      const safetyPlan = safetyPlanSchema.parse(tidySafetyPlan(next))
      const entries = useEntriesStore()
      const current = await getSafetyPlanEntry()
      if (current) return entries.update(current.id, { safetyPlan })
      return entries.create({ kind: 'safetyPlan', body: '', wants: [], backgroundThoughts: [], tags: [], safetyPlan })
    })
    chain = run.catch(() => undefined)
    return run
  }

  return { entry, plan, loaded, draft, freshPlan, save }
})

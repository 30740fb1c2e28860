import type { SafetyPlan } from '@shared/schemas/safetyPlan.schema'

export interface SafetyPlanSection {
  title: string
  lines: string[]
}

const contactLine = (c: SafetyPlan['askForHelp'][number]) => [c.name, c.phone, c.note].filter((s) => s && s.trim()).join(' · ')

/**
 * A local stand-in for shared/content/safetyPlanSections.ts (being written alongside): the plan as titled sections of
 * lines, empty sections left out. Replace the import with the shared one once it is in main.
 */
export function safetyPlanSections(plan: SafetyPlan): SafetyPlanSection[] {
  const sections: SafetyPlanSection[] = [
    { title: 'Signs that a hard time may be starting', lines: plan.warningSigns },
    { title: 'Things I can do on my own', lines: plan.onMyOwn },
    { title: 'People and places that help me feel better', lines: plan.peopleAndPlaces },
    { title: 'People I can ask for help', lines: plan.askForHelp.map(contactLine) },
    { title: 'Professionals and services I can contact', lines: plan.professionals.map(contactLine) },
    { title: 'Making my surroundings safer', lines: plan.saferSurroundings },
    { title: 'My reason to keep going', lines: plan.reasonToKeepGoing.trim() ? [plan.reasonToKeepGoing] : [] },
  ]
  return sections.map((s) => ({ ...s, lines: s.lines.filter((l) => l.trim()) })).filter((s) => s.lines.length > 0)
}

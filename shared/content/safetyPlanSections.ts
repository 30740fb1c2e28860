import type { SafetyPlan } from '../schemas/safetyPlan.schema'
import { displayNumber, regionResources, type RegionCode } from './crisisLines'

export type SafetyPlanContact = SafetyPlan['askForHelp'][number]
export type SafetyPlanSectionKey = keyof SafetyPlan

/**
 * The steps of the plan in the order of the Safety Planning Intervention (Stanley & Brown 2012), with titles and prompts
 * in Rungs' own words. The prompts never ask how someone might hurt themselves.
 */
export const safetyPlanSteps: readonly { key: SafetyPlanSectionKey; title: string; prompt: string }[] = [
  {
    key: 'warningSigns',
    title: 'Signs that a hard time is starting',
    prompt: 'What tells you things are getting harder? Thoughts, feelings, places or times of day, things you notice yourself doing.',
  },
  {
    key: 'onMyOwn',
    title: 'Things I can do on my own',
    prompt: 'Small things that take the edge off or help the time pass, that need nobody else. Small is fine.',
  },
  {
    key: 'peopleAndPlaces',
    title: 'People and places that help me feel better',
    prompt: 'People you like being around, or places you can go, that lift things a little. You do not have to talk about how you feel.',
  },
  {
    key: 'askForHelp',
    title: 'People I can ask for help',
    prompt: 'People you trust enough to tell that you are struggling. Add a phone number and you can call them from here in one tap.',
  },
  {
    key: 'professionals',
    title: 'Professionals and crisis lines',
    prompt: 'Your therapist, your doctor, a crisis line. The lines from Help now for your region are already here; change them as you like.',
  },
  {
    key: 'saferSurroundings',
    title: 'Making my surroundings safer',
    prompt:
      'Ways to put some distance, for a while, between you and anything you could use to hurt yourself: somewhere harder to reach, or someone you trust keeping it for now. This is a good one to work out together with your therapist.',
  },
  {
    key: 'reasonToKeepGoing',
    title: 'My reason to keep going',
    prompt: 'Someone or something that matters to you, even a little, even on a hard day.',
  },
]

/** One contact as a line: "Name — phone (note)", leaving out what is empty. */
export function contactLine(c: SafetyPlanContact): string {
  const phone = c.phone?.trim()
  const note = c.note?.trim()
  return `${c.name.trim()}${phone ? ` — ${phone}` : ''}${note ? ` (${note})` : ''}`
}

/** A `tel:` address for what the person typed as a phone number, or undefined when it holds no digits. */
export function telHref(phone: string | undefined): string | undefined {
  const dial = (phone ?? '').replace(/[^\d+]/g, '').replace(/(?!^)\+/g, '')
  return /\d/.test(dial) ? `tel:${dial}` : undefined
}

/**
 * The plan as titled sections of plain lines, in the plan's order, for the read view and the summary PDF (so both say
 * the same). Every step is returned; a step not filled in yet has no lines. Contacts read "Name — phone (note)".
 */
export function safetyPlanSections(plan: SafetyPlan): { key: SafetyPlanSectionKey; title: string; lines: string[]; contacts?: SafetyPlanContact[] }[] {
  return safetyPlanSteps.map(({ key, title }) => {
    if (key === 'askForHelp' || key === 'professionals') {
      const contacts = plan[key].filter((c) => c.name.trim() || c.phone?.trim())
      return { key, title, lines: contacts.map(contactLine), contacts }
    }
    if (key === 'reasonToKeepGoing') return { key, title, lines: splitLines(plan.reasonToKeepGoing) }
    return { key, title, lines: plan[key].map((l) => l.trim()).filter(Boolean) }
  })
}

function splitLines(text: string): string[] {
  return text.split(/\r?\n/).map((l) => l.trim()).filter(Boolean)
}

/** The region's emergency number and crisis lines from Help now, as plan contacts: what a fresh plan starts with. */
export function helpNowContacts(region: RegionCode): SafetyPlanContact[] {
  const r = regionResources(region)
  const check = (fromMemory?: boolean) => (fromMemory ? ' Check this number locally.' : '')
  const emergency: SafetyPlanContact = {
    name: 'Emergency services',
    phone: r.emergency.number,
    note: `If I am in danger now.${check(r.emergency.fromMemory)}`,
  }
  const lines = r.contacts
    .filter((c) => !c.youth)
    .map((c): SafetyPlanContact => {
      const text = c.text ? ` Text ${c.text.body ? `${c.text.body} to ` : ''}${displayNumber(c.text.to)}.` : ''
      return {
        name: c.name,
        ...(c.call ? { phone: displayNumber(c.call) } : {}),
        note: `${c.detail}${c.call ? '' : text}${check(c.fromMemory)}`,
      }
    })
  return [emergency, ...lines]
}

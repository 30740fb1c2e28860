/**
 * The PHQ-9 and GAD-7 as printed, with their LOINC codes. The wording is the instruments' own and must not be edited:
 * the validity of the scores depends on it (REFERENCE.md §1a). Both are free to use: "No permission required to
 * reproduce, translate, display or distribute" (Pfizer copyright notice, as in the US Core PHQ-9 Questionnaire).
 */
export type InstrumentId = 'phq9' | 'gad7'

export interface AnswerOption {
  value: 0 | 1 | 2 | 3
  /** LOINC answer code (US Core / PCO IG). */
  code: string
  display: string
}

export interface FormItem {
  /** FHIR linkId, also used as the item's key on the device. */
  linkId: string
  loinc: string
  text: string
}

export interface MeasureForm {
  id: InstrumentId
  /** Name as the trade writes it. */
  name: 'PHQ-9' | 'GAD-7'
  /** What it asks about, in plain words for lists and the therapist's outcome sentences. */
  topic: 'depression' | 'anxiety'
  recall: string
  stem: string
  items: FormItem[]
  panelLoinc: string
  totalLoinc: string
  panelDisplay: string
  totalDisplay: string
  maxTotal: number
  copyright: string
}

// LOINC LA6568-5…LA6571-9 (US Core, PCO IG; REFERENCE.md §4).
export const frequencyOptions: readonly AnswerOption[] = [
  { value: 0, code: 'LA6568-5', display: 'Not at all' },
  { value: 1, code: 'LA6569-3', display: 'Several days' },
  { value: 2, code: 'LA6570-1', display: 'More than half the days' },
  { value: 3, code: 'LA6571-9', display: 'Nearly every day' },
]

/** The difficulty question printed with both forms; not scored. The LOINC codes are not in numeric order. */
export const difficultyQuestion = {
  linkId: 'difficulty',
  loinc: '69722-7',
  text: 'If you checked off any problems, how difficult have these problems made it for you to do your work, take care of things at home, or get along with other people?',
  options: [
    { value: 0, code: 'LA6572-7', display: 'Not difficult at all' },
    { value: 1, code: 'LA6573-5', display: 'Somewhat difficult' },
    { value: 2, code: 'LA6575-0', display: 'Very difficult' },
    { value: 3, code: 'LA6574-3', display: 'Extremely difficult' },
  ] as const satisfies readonly AnswerOption[],
}

export const freeUseNotice =
  'Developed by Drs. Robert L. Spitzer, Janet B.W. Williams, Kurt Kroenke and colleagues, with an educational grant from Pfizer Inc. No permission required to reproduce, translate, display or distribute.'

export const phq9Form: MeasureForm = {
  id: 'phq9',
  name: 'PHQ-9',
  topic: 'depression',
  recall: 'Over the last 2 weeks',
  stem: 'Over the last 2 weeks, how often have you been bothered by any of the following problems?',
  // Kroenke, Spitzer & Williams 2001; LOINC item codes from the PCO IG (REFERENCE.md §4).
  items: [
    { linkId: 'phq9-1', loinc: '44250-9', text: 'Little interest or pleasure in doing things' },
    { linkId: 'phq9-2', loinc: '44255-8', text: 'Feeling down, depressed, or hopeless' },
    { linkId: 'phq9-3', loinc: '44259-0', text: 'Trouble falling or staying asleep, or sleeping too much' },
    { linkId: 'phq9-4', loinc: '44254-1', text: 'Feeling tired or having little energy' },
    { linkId: 'phq9-5', loinc: '44251-7', text: 'Poor appetite or overeating' },
    { linkId: 'phq9-6', loinc: '44258-2', text: 'Feeling bad about yourself — or that you are a failure or have let yourself or your family down' },
    { linkId: 'phq9-7', loinc: '44252-5', text: 'Trouble concentrating on things, such as reading the newspaper or watching television' },
    {
      linkId: 'phq9-8',
      loinc: '44253-3',
      text: 'Moving or speaking so slowly that other people could have noticed? Or the opposite — being so fidgety or restless that you have been moving around a lot more than usual',
    },
    { linkId: 'phq9-9', loinc: '44260-8', text: 'Thoughts that you would be better off dead, or of hurting yourself in some way' },
  ],
  panelLoinc: '44249-1',
  totalLoinc: '44261-6',
  panelDisplay: 'PHQ-9 quick depression assessment panel [Reported.PHQ]',
  totalDisplay: 'Patient Health Questionnaire 9 item (PHQ-9) total score [Reported]',
  maxTotal: 27,
  copyright: `Copyright © Pfizer Inc. ${freeUseNotice}`,
}

export const gad7Form: MeasureForm = {
  id: 'gad7',
  name: 'GAD-7',
  topic: 'anxiety',
  recall: 'Over the last 2 weeks',
  stem: 'Over the last 2 weeks, how often have you been bothered by the following problems?',
  // Spitzer, Kroenke, Williams & Löwe 2006; LOINC item codes from the PCO IG (REFERENCE.md §4).
  items: [
    { linkId: 'gad7-1', loinc: '69725-0', text: 'Feeling nervous, anxious, or on edge' },
    { linkId: 'gad7-2', loinc: '68509-9', text: 'Not being able to stop or control worrying' },
    { linkId: 'gad7-3', loinc: '69733-4', text: 'Worrying too much about different things' },
    { linkId: 'gad7-4', loinc: '69734-2', text: 'Trouble relaxing' },
    { linkId: 'gad7-5', loinc: '69735-9', text: 'Being so restless that it is hard to sit still' },
    { linkId: 'gad7-6', loinc: '69689-8', text: 'Becoming easily annoyed or irritable' },
    { linkId: 'gad7-7', loinc: '69736-7', text: 'Feeling afraid, as if something awful might happen' },
  ],
  panelLoinc: '69737-5',
  totalLoinc: '70274-6',
  panelDisplay: 'Generalized anxiety disorder 7 item (GAD-7)',
  totalDisplay: 'Generalized anxiety disorder 7 item (GAD-7) total score [Reported.PHQ]',
  maxTotal: 21,
  copyright: `Copyright © Pfizer Inc. ${freeUseNotice}`,
}

export const measureForms: Record<InstrumentId, MeasureForm> = { phq9: phq9Form, gad7: gad7Form }

/** The PHQ-9 item on thoughts of self-harm (index 8, LOINC 44260-8). */
export const phq9SelfHarmIndex = 8

/**
 * Maps a LOINC answer code to its score. LA18938-3 "More days than not" is the PCO IG's code for GAD-7 item 2; it is
 * accepted on import as 2 and never emitted (REFERENCE.md §4).
 */
export function scoreOfAnswerCode(code: string): 0 | 1 | 2 | 3 | undefined {
  if (code === 'LA18938-3') return 2
  return frequencyOptions.find((o) => o.code === code)?.value
}

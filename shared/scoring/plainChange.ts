import type { InstrumentId } from '../content/measureForms'
import { reliableChangePoints } from './talkingTherapies'

export interface PlainChange {
  /** Latest minus first: negative means fewer symptoms. */
  difference: number
  text: string
  /** A rise of at least the reliable-change points (6 PHQ-9, 4 GAD-7; Talking Therapies). Shown with support, never alone. */
  reliableWorsening: boolean
}

/** What the person sees about change: plain words, no outcome classes (DESIGN.md, Safety). */
export function plainChange(instrument: InstrumentId, first: number, latest: number): PlainChange {
  const difference = latest - first
  const n = Math.abs(difference)
  const points = n === 1 ? 'point' : 'points'
  const text = difference === 0 ? 'The same as your first' : `${n} ${points} ${difference < 0 ? 'lower' : 'higher'} than your first`
  return { difference, text, reliableWorsening: difference >= reliableChangePoints[instrument] }
}

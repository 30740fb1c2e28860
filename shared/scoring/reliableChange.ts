/**
 * Reliable change and clinical significance (Jacobson & Truax 1991, J Consult Clin Psychol 59:12–19). General
 * functions: they are used only where a therapist supplies published norms for a measure. PHQ-9 and GAD-7 use the
 * Talking Therapies thresholds instead (talkingTherapies.ts).
 */
export interface ReliabilityNorms {
  /** SD of the pre-treatment (dysfunctional) group. */
  s1: number
  /** Test–retest reliability, 0 < rxx < 1. */
  rxx: number
}

/** SE = s1·√(1 − rxx); Sdiff = √(2·SE²); the smallest reliable raw change is 1.96·Sdiff (p < .05). */
export function reliableChangeThreshold({ s1, rxx }: ReliabilityNorms): { se: number; sdiff: number; threshold: number } {
  if (!(s1 > 0) || !(rxx > 0 && rxx < 1)) throw new RangeError('Reliable change needs s1 > 0 and 0 < rxx < 1.')
  const se = s1 * Math.sqrt(1 - rxx)
  return sdiffFromSe(se)
}

/** The same from a published standard error of measurement. */
export function sdiffFromSe(se: number): { se: number; sdiff: number; threshold: number } {
  if (!(se > 0)) throw new RangeError('The standard error must be above 0.')
  const sdiff = Math.sqrt(2 * se * se)
  return { se, sdiff, threshold: 1.96 * sdiff }
}

/** RC = (post − pre) / Sdiff; |RC| > 1.96 is a reliable change. */
export function reliableChangeIndex(pre: number, post: number, sdiff: number): { rc: number; reliable: boolean } {
  const rc = (post - pre) / sdiff
  return { rc, reliable: Math.abs(rc) > 1.96 }
}

export interface PopulationNorms {
  /** Mean and SD of the functional population. */
  m0: number
  s0: number
  /** Mean and SD of the dysfunctional population. */
  m1: number
  s1: number
}

/** Cut-off c = (s0·M1 + s1·M0) / (s0 + s1): the point nearer the functional mean than the dysfunctional one. */
export function cutOffC({ m0, s0, m1, s1 }: PopulationNorms): number {
  if (!(s0 > 0 && s1 > 0)) throw new RangeError('Cut-off c needs both SDs above 0.')
  return (s0 * m1 + s1 * m0) / (s0 + s1)
}

export type JacobsonTruaxClass = 'recovered' | 'improved' | 'unchanged' | 'deteriorated'

/**
 * The four outcome classes (higher = worse): recovered = reliable improvement that ends past c; improved = reliable
 * only; deteriorated = reliable worsening; otherwise unchanged.
 */
export function jacobsonTruaxClass(pre: number, post: number, norms: ReliabilityNorms & PopulationNorms): JacobsonTruaxClass {
  const { sdiff } = reliableChangeThreshold(norms)
  const { reliable } = reliableChangeIndex(pre, post, sdiff)
  if (!reliable) return 'unchanged'
  if (post > pre) return 'deteriorated'
  return post < cutOffC(norms) ? 'recovered' : 'improved'
}

/**
 * A two-loop control model of a tug, used only to draw the tug picture: an illustration of the idea, never a measurement
 * of the person.
 *
 * Two control loops act on one shared variable q (the situation). Each loop compares q with its own aim (reference) and
 * pushes. The loop algebra is the textbook proportional loop (Åström & Murray 2008, Feedback Systems, ch. on PID control
 * [chapter from memory]); the conflict reading and the leaky output form follow ../REFERENCE.md §7.
 */

/** Gains, aims and disturbance of the two loops of a tug. A gain of 0 means that loop is absent. */
export interface TugLoopParams {
  /** Loop gain of want A, ≥ 0. */
  kA: number
  /** Loop gain of want B, ≥ 0. */
  kB: number
  /** Aim (reference) of want A for the shared situation q. */
  rA: number
  /** Aim (reference) of want B for the shared situation q. */
  rB: number
  /** Outside disturbance added to q. */
  d: number
}

/** Outputs of both loops at one moment. */
export interface TugOutputs {
  oA: number
  oB: number
}

/** The settled state of the leaky two-loop model. */
export interface TugSteadyState extends TugOutputs {
  q: number
  /** |oA| + |oB|: how hard both loops push in total. */
  effort: number
}

/** Values over time, index 0 being the starting state. */
export interface TugTimeSeries {
  q: number[]
  oA: number[]
  oB: number[]
  effort: number[]
}

/** Values over time of the pure-integrator form, with both errors. */
export interface IntegratingTimeSeries extends TugTimeSeries {
  eA: number[]
  eB: number[]
}

/** Symmetric output limits: each output is held within ±max. */
export interface OutputLimits {
  max: number
}

/** Importance is rated 0–10 (DESIGN.md, want). */
export const importanceMax = 10

/**
 * Gain per point of importance. Our choice, not a published value: 5 makes importance 10 a gain of 50, the gain of the
 * check values in REFERENCE.md §7, and any importance of 1 or more a loop strong enough to show a clear stalemate.
 */
export const gainPerImportance = 5

/**
 * Aims of the stuck picture: want A aims the situation at 10, want B at 0. Our choice, the same aims as the REFERENCE.md §7
 * check values (rA = 10, rB = 0), so the situation stays on a plain 0–10 scale.
 */
export const stuckAims = { rA: 10, rB: 0 } as const

/**
 * Shared aim of the meeting-point picture: a higher want sets both loops to the same aim. Our choice: the midpoint of the
 * stuck aims (REFERENCE.md §7 check values use rA = rB = 5), so with equal gains the situation ends where it was held and only
 * the effort changes.
 */
export const meetingAim = (stuckAims.rA + stuckAims.rB) / 2

/** Points kept per drawn series; enough for a smooth curve in a small SVG. */
export const picturePoints = 61

/** Settling length of a drawn series, in units of 1/s steps: the slow mode decays as (1 − s)ⁿ ≈ e^(−6) ≈ 0.25 % left. */
const pictureSettleTimes = 6

/**
 * Maps a want's importance (0–10) to a loop gain: k = importance × 5.
 * Missing, non-finite or non-positive importance gives 0 (no loop); values above 10 are treated as 10.
 */
export function gainFromImportance(importance?: number): number {
  if (importance === undefined || !Number.isFinite(importance) || importance <= 0) return 0
  return Math.min(importance, importanceMax) * gainPerImportance
}

/** A gain below 0 would be positive feedback and one that is not finite has no meaning: both count as no loop. */
function safeGain(k: number): number {
  return Number.isFinite(k) && k > 0 ? k : 0
}

/**
 * Settled state of the leaky two-loop model, from the closed form in REFERENCE.md §7 (derived by setting the increments
 * to zero): oA = kA·eA, oB = kB·eB, so q = (kA·rA + kB·rB + d) / (1 + kA + kB).
 * Gains are at least 0, so the denominator is at least 1: no division by zero, even with no loop at all.
 */
export function steadyState({ kA, kB, rA, rB, d }: TugLoopParams): TugSteadyState {
  const a = safeGain(kA)
  const b = safeGain(kB)
  const q = (a * rA + b * rB + d) / (1 + a + b)
  // An absent loop outputs exactly 0 (not −0, which would print as "-0").
  const oA = a === 0 ? 0 : a * (rA - q)
  const oB = b === 0 ? 0 : b * (rB - q)
  return { q, oA, oB, effort: Math.abs(oA) + Math.abs(oB) }
}

/**
 * A step for the leaky update that converges: s = 1 / (1 + kA + kB).
 * The update o ← (1 − s)·o + s·K·(r − Σo − d) has eigenvalues 1 − s and 1 − s·(1 + kA + kB) (derived), so it is stable
 * only when s·(1 + kA + kB) < 2 (REFERENCE.md §7, derived). This choice puts the second eigenvalue at 0 and keeps s ≤ 1.
 */
export function stableStep(kA: number, kB: number): number {
  return 1 / (1 + safeGain(kA) + safeGain(kB))
}

/**
 * Whether the leaky update with step s settles: 0 < s ≤ 1 (the slowing factor's range, REFERENCE.md §7) and
 * s·(1 + kA + kB) < 2 (stability bound, REFERENCE.md §7, derived).
 */
export function isStableStep(s: number, kA: number, kB: number): boolean {
  return Number.isFinite(s) && s > 0 && s <= 1 && s * (1 + safeGain(kA) + safeGain(kB)) < 2
}

/**
 * Runs the leaky (damped) two-loop model of REFERENCE.md §7 for `steps` updates with slowing factor s:
 * q = oA + oB + d; eA = rA − q; eB = rB − q; oA ← oA + s·(kA·eA − oA); oB ← oB + s·(kB·eB − oB).
 * Both outputs update from the same q. Returns arrays of length steps + 1; index 0 is the starting state (rest unless
 * `start` is given). An unstable s (see isStableStep) is run as asked, so its divergence can be shown.
 */
export function simulateLeaky(params: TugLoopParams, steps: number, s: number, start?: TugOutputs): TugTimeSeries {
  const kA = safeGain(params.kA)
  const kB = safeGain(params.kB)
  const { rA, rB, d } = params
  let oA = start?.oA ?? 0
  let oB = start?.oB ?? 0
  const series: TugTimeSeries = { q: [], oA: [], oB: [], effort: [] }
  const record = () => {
    series.q.push(oA + oB + d)
    series.oA.push(oA)
    series.oB.push(oB)
    series.effort.push(Math.abs(oA) + Math.abs(oB))
  }
  record()
  for (let i = 0; i < steps; i++) {
    const q = oA + oB + d
    const nextA = oA + s * (kA * (rA - q) - oA)
    const nextB = oB + s * (kB * (rB - q) - oB)
    oA = nextA
    oB = nextB
    record()
  }
  return series
}

/**
 * Runs the pure-integrator form (REFERENCE.md §7; the tracking-model loop, Åström & Murray 2008 loop algebra) for `steps`
 * updates of length dt: q = oA + oB + d; eA = rA − q; eB = rB − q; oA ← oA + kA·eA·dt; oB ← oB + kB·eB·dt, each output then
 * held within ±limits.max when limits are given.
 * With kB = 0 this is the single loop p = o + d; e = r − p; o ← o + k·e·dt (oB stays 0; see singleLoop).
 * Returns arrays of length steps + 1 starting at rest; q and the errors at index i are computed from the outputs at index i.
 */
export function simulateIntegrating(
  params: TugLoopParams,
  steps: number,
  dt: number,
  limits?: OutputLimits,
): IntegratingTimeSeries {
  const kA = safeGain(params.kA)
  const kB = safeGain(params.kB)
  const { rA, rB, d } = params
  const max = limits && Number.isFinite(limits.max) ? Math.abs(limits.max) : Infinity
  const hold = (o: number) => Math.min(max, Math.max(-max, o))
  let oA = 0
  let oB = 0
  const series: IntegratingTimeSeries = { q: [], oA: [], oB: [], effort: [], eA: [], eB: [] }
  const record = () => {
    const q = oA + oB + d
    series.q.push(q)
    series.oA.push(oA)
    series.oB.push(oB)
    series.eA.push(rA - q)
    series.eB.push(rB - q)
    series.effort.push(Math.abs(oA) + Math.abs(oB))
  }
  record()
  for (let i = 0; i < steps; i++) {
    const q = oA + oB + d
    const nextA = hold(oA + kA * (rA - q) * dt)
    const nextB = hold(oB + kB * (rB - q) * dt)
    oA = nextA
    oB = nextB
    record()
  }
  return series
}

/** Parameters for a single loop (p = o + d; e = r − p) in the two-loop form: the second loop is absent. */
export function singleLoop(k: number, r: number, d: number): TugLoopParams {
  return { kA: k, kB: 0, rA: r, rB: 0, d }
}

/** Only what the picture needs from a want. */
export interface WantLike {
  importance?: number
}

/** One drawn series of the tug picture, sampled to picturePoints points over time. */
export interface TugPictureSeries extends TugTimeSeries {
  /** The aims the two loops hold during this series. */
  rA: number
  rB: number
  /** Step index of each sampled point, for the time axis. */
  step: number[]
}

/** Numbers for the picture's text alternative; efforts are the settled values from the closed form. */
export interface TugPictureSummary {
  stuckEffort: number
  /** Absent (null) without a meeting point. */
  meetingEffort: number | null
  /** meetingEffort / stuckEffort; null without a meeting point. */
  ratio: number | null
}

/** What the UI draws for a tug. Without two loops there is no pull to draw. */
export type TugPicture =
  | { hasPull: false; loops: 0 | 1; stuck: null; meeting: null; summary: null }
  | {
      hasPull: true
      loops: 2
      gains: { kA: number; kB: number }
      /** Held between the two aims: the situation sits between them while the efforts grow large and opposed. */
      stuck: TugPictureSeries
      /** Seen from the meeting point: both loops share one aim, starting from the stuck state; effort falls. */
      meeting: TugPictureSeries | null
      summary: TugPictureSummary
    }

/**
 * The series the tug picture draws, from each want's importance (gain = importance × 5, see gainFromImportance).
 * Stuck: aims 10 and 0 (stuckAims), starting at rest. From above (only with a meeting point): both aims set to 5
 * (meetingAim), starting from the stuck settled state, so the effort is seen to fall. Both use the converging step
 * s = 1/(1 + kA + kB). With equal gains k the meeting effort is 1/(1 + 2k) of the stuck effort (derived from the closed form).
 * A missing want or importance 0 is no loop; with fewer than two loops there is no pull and nothing to draw.
 */
export function tugPicture(wantA: WantLike | undefined, wantB: WantLike | undefined, hasMeetingPoint: boolean): TugPicture {
  const kA = gainFromImportance(wantA?.importance)
  const kB = gainFromImportance(wantB?.importance)
  const loops = (kA > 0 ? 1 : 0) + (kB > 0 ? 1 : 0)
  if (loops < 2) return { hasPull: false, loops: loops === 0 ? 0 : 1, stuck: null, meeting: null, summary: null }

  const s = stableStep(kA, kB)
  const steps = Math.ceil(pictureSettleTimes / s)
  const stuckParams: TugLoopParams = { kA, kB, rA: stuckAims.rA, rB: stuckAims.rB, d: 0 }
  const stuckEnd = steadyState(stuckParams)
  const stuck = sampled(stuckParams, simulateLeaky(stuckParams, steps, s))

  let meeting: TugPictureSeries | null = null
  let meetingEffort: number | null = null
  if (hasMeetingPoint) {
    const meetingParams: TugLoopParams = { kA, kB, rA: meetingAim, rB: meetingAim, d: 0 }
    meeting = sampled(meetingParams, simulateLeaky(meetingParams, steps, s, { oA: stuckEnd.oA, oB: stuckEnd.oB }))
    meetingEffort = steadyState(meetingParams).effort
  }
  const ratio = meetingEffort === null || stuckEnd.effort === 0 ? null : meetingEffort / stuckEnd.effort
  return {
    hasPull: true,
    loops: 2,
    gains: { kA, kB },
    stuck,
    meeting,
    summary: { stuckEffort: stuckEnd.effort, meetingEffort, ratio },
  }
}

function sampled(params: TugLoopParams, full: TugTimeSeries): TugPictureSeries {
  const last = full.q.length - 1
  const out: TugPictureSeries = { rA: params.rA, rB: params.rB, step: [], q: [], oA: [], oB: [], effort: [] }
  for (let i = 0; i < picturePoints; i++) {
    const at = Math.round((i * last) / (picturePoints - 1))
    out.step.push(at)
    out.q.push(full.q[at] ?? 0)
    out.oA.push(full.oA[at] ?? 0)
    out.oB.push(full.oB[at] ?? 0)
    out.effort.push(full.effort[at] ?? 0)
  }
  return out
}

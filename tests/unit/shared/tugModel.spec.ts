import { describe, expect, it } from 'vitest'
import {
  gainFromImportance,
  isStableStep,
  meetingAim,
  picturePoints,
  simulateIntegrating,
  simulateLeaky,
  singleLoop,
  stableStep,
  steadyState,
  stuckAims,
  tugPicture,
  type TugLoopParams,
} from '../../../shared/scoring/tugModel'

const last = (xs: number[]): number => {
  const x = xs[xs.length - 1]
  if (x === undefined) throw new Error('empty series')
  return x
}

/** Every number anywhere inside a value, so a test can check none is NaN or infinite. */
function numbersIn(value: unknown): number[] {
  if (typeof value === 'number') return [value]
  if (Array.isArray(value)) return value.flatMap(numbersIn)
  if (value && typeof value === 'object') return Object.values(value).flatMap(numbersIn)
  return []
}

const stuck50: TugLoopParams = { kA: 50, kB: 50, rA: 10, rB: 0, d: 0 }
const fromAbove50: TugLoopParams = { kA: 50, kB: 50, rA: 5, rB: 5, d: 0 }

describe('gainFromImportance', () => {
  it('maps importance 0–10 to gains 0–50, so importance 10 meets the REFERENCE check gain', () => {
    expect(gainFromImportance(10)).toBe(50) // REFERENCE §7 check values use k = 50 (our mapping k = 5 × importance)
    expect(gainFromImportance(3)).toBe(15)
  })

  it('gives no loop for a missing, zero, negative or non-number importance, and caps at 10', () => {
    expect(gainFromImportance(undefined)).toBe(0)
    expect(gainFromImportance(0)).toBe(0)
    expect(gainFromImportance(-2)).toBe(0)
    expect(gainFromImportance(Number.NaN)).toBe(0)
    expect(gainFromImportance(25)).toBe(50)
  })
})

describe('steadyState (leaky two-loop model)', () => {
  it('matches the closed form for a stuck tug: large opposed efforts', () => {
    const s = steadyState(stuck50)
    // REFERENCE §7 check values, derived: q = 500/101 ≈ 4.950, oA ≈ 252.5, oB ≈ −247.5, effort ≈ 500
    expect(s.q).toBeCloseTo(500 / 101, 10) // Åström & Murray 2008, loop algebra: q = (kA·rA + kB·rB + d)/(1 + kA + kB)
    expect(s.q).toBeCloseTo(4.95, 2)
    expect(s.oA).toBeCloseTo(252.5, 1)
    expect(s.oB).toBeCloseTo(-247.5, 1)
    expect(s.effort).toBeCloseTo(500, 6)
  })

  it('matches the closed form when a compatible aim is set from above: effort about a hundredth', () => {
    const s = steadyState(fromAbove50)
    // REFERENCE §7 check values, derived: q ≈ 4.950, oA = oB ≈ 2.475, effort ≈ 4.95
    expect(s.q).toBeCloseTo(4.95, 2)
    expect(s.oA).toBeCloseTo(2.475, 3)
    expect(s.oB).toBeCloseTo(2.475, 3)
    expect(s.effort).toBeCloseTo(4.95, 2)
    expect(s.effort / steadyState(stuck50).effort).toBeCloseTo(1 / 101, 6) // derived: 1/(1 + 2k) for equal gains
  })

  it('satisfies the loop equations it was derived from (oA = kA·eA, oB = kB·eB, q = oA + oB + d)', () => {
    const p: TugLoopParams = { kA: 7, kB: 31, rA: 3, rB: -8, d: 1.5 }
    const s = steadyState(p)
    // Åström & Murray 2008, loop algebra; REFERENCE §7 leaky form with the increments set to zero (derived)
    expect(s.oA).toBeCloseTo(p.kA * (p.rA - s.q), 10)
    expect(s.oB).toBeCloseTo(p.kB * (p.rB - s.q), 10)
    expect(s.q).toBeCloseTo(s.oA + s.oB + p.d, 10)
  })

  it('stays finite with no loop at all or only one loop', () => {
    const none = steadyState({ kA: 0, kB: 0, rA: 10, rB: 0, d: 2 })
    expect(none).toEqual({ q: 2, oA: 0, oB: 0, effort: 0 })
    const one = steadyState({ kA: 50, kB: 0, rA: 10, rB: 0, d: 0 })
    expect(one.oB).toBe(0)
    expect(one.q).toBeCloseTo(500 / 51, 10) // derived from the closed form with kB = 0
    expect(numbersIn(one).every(Number.isFinite)).toBe(true)
  })
})

describe('stableStep and isStableStep', () => {
  it('gives s = 1/(1 + kA + kB), which is inside the bound', () => {
    expect(stableStep(50, 50)).toBeCloseTo(1 / 101, 12) // REFERENCE §7: s = 1/(1 + kA + kB) converges (derived)
    expect(isStableStep(stableStep(50, 50), 50, 50)).toBe(true)
    expect(stableStep(0, 0)).toBe(1)
  })

  it('applies the bound s·(1 + kA + kB) < 2', () => {
    // REFERENCE §7, derived: stable only when s·(1 + kA + kB) < 2; s = 0.05 with gains 50 diverges
    expect(isStableStep(0.05, 50, 50)).toBe(false)
    expect(isStableStep(1.9 / 101, 50, 50)).toBe(true)
    expect(isStableStep(2 / 101, 50, 50)).toBe(false)
    expect(isStableStep(0, 50, 50)).toBe(false)
    expect(isStableStep(Number.NaN, 50, 50)).toBe(false)
  })
})

describe('simulateLeaky', () => {
  it('converges to the closed form with s = 1/(1 + kA + kB)', () => {
    const run = simulateLeaky(stuck50, 3000, stableStep(50, 50))
    const closed = steadyState(stuck50)
    // REFERENCE §7, derived: s = 1/(1 + kA + kB) converges to the closed form
    expect(last(run.q)).toBeCloseTo(closed.q, 6)
    expect(last(run.oA)).toBeCloseTo(closed.oA, 4)
    expect(last(run.oB)).toBeCloseTo(closed.oB, 4)
    expect(last(run.effort)).toBeCloseTo(500, 3)
    expect(run.q).toHaveLength(3001)
  })

  it('also converges near the edge of the bound, oscillating on the way', () => {
    const run = simulateLeaky(stuck50, 6000, 1.9 / 101)
    // REFERENCE §7, derived: any s with s·(1 + kA + kB) < 2 settles
    expect(last(run.q)).toBeCloseTo(steadyState(stuck50).q, 4)
  })

  it('diverges with s = 0.05 at gains 50', () => {
    const run = simulateLeaky(stuck50, 60, 0.05)
    // REFERENCE §7, derived: s = 0.05 and gains 50 gives s·101 = 5.05 > 2, so the run grows without bound
    expect(Math.abs(last(run.q))).toBeGreaterThan(1e20)
    expect(last(run.effort)).toBeGreaterThan(run.effort[30] ?? Infinity)
  })

  it('starts from the given outputs', () => {
    const run = simulateLeaky(fromAbove50, 1, stableStep(50, 50), { oA: 252.5, oB: -247.5 })
    expect(run.oA[0]).toBe(252.5)
    expect(run.effort[0]).toBe(500)
  })

  it('gives finite values when a loop is missing', () => {
    const run = simulateLeaky({ kA: 0, kB: 30, rA: 10, rB: 0, d: 1 }, 200, stableStep(0, 30))
    expect(numbersIn(run).every(Number.isFinite)).toBe(true)
    expect(run.oA.every((o) => o === 0)).toBe(true)
  })
})

describe('simulateIntegrating (pure integrator)', () => {
  it('row 17: a single loop brings p to r and its output cancels the disturbance', () => {
    const r = 10, d = 3, k = 5
    const run = simulateIntegrating(singleLoop(k, r, d), 500, 0.01)
    // REFERENCE §7 check row 17, equations [C], simulated: p ≈ 10.000, o ≈ 7.000, e ≈ 0; steady state p → r, o → r − d
    expect(last(run.q)).toBeCloseTo(r, 3)
    expect(last(run.oA)).toBeCloseTo(r - d, 3)
    expect(last(run.eA)).toBeCloseTo(0, 3)
    expect(run.oB.every((o) => o === 0)).toBe(true)
  })

  it('row 18: equal gains, no limits — q at the virtual reference, fixed errors, outputs running away', () => {
    const p: TugLoopParams = { kA: 5, kB: 5, rA: 10, rB: 0, d: 0 }
    const dt = 0.01, steps = 1000
    const run = simulateIntegrating(p, steps, dt)
    // REFERENCE §7 check row 18, derived: virtual reference (kA·rA + kB·rB)/(kA + kB)
    const virtual = (p.kA * p.rA + p.kB * p.rB) / (p.kA + p.kB)
    const eA = (p.kB * (p.rA - p.rB)) / (p.kA + p.kB)
    const eB = (-p.kA * (p.rA - p.rB)) / (p.kA + p.kB)
    const rate = (p.kA * p.kB * (p.rA - p.rB)) / (p.kA + p.kB)
    expect(virtual).toBe(5)
    expect(rate).toBe(25) // REFERENCE §7 row 18: outputs grow 25 per time unit (derived)
    expect(last(run.q)).toBeCloseTo(virtual, 6)
    expect(last(run.eA)).toBeCloseTo(eA, 6)
    expect(last(run.eB)).toBeCloseTo(eB, 6)
    expect(last(run.oA)).toBeCloseTo(252.5, 3) // REFERENCE §7 check row 18, derived/simulated
    expect(last(run.oB)).toBeCloseTo(-247.5, 3)
    // Growth over the last time unit (100 steps) matches the derived run-away rate.
    const oA900 = run.oA[steps - 100] ?? Number.NaN
    expect(last(run.oA) - oA900).toBeCloseTo(rate * 100 * dt, 3)
  })

  it('row 19: unequal gains put q nearer the stronger aim', () => {
    const p: TugLoopParams = { kA: 8, kB: 2, rA: 10, rB: 0, d: 0 }
    const run = simulateIntegrating(p, 1000, 0.01)
    // REFERENCE §7 check row 19: virtual reference (8·10 + 2·0)/10, simulated
    const virtual = (p.kA * p.rA + p.kB * p.rB) / (p.kA + p.kB)
    expect(virtual).toBe(8)
    expect(last(run.q)).toBeCloseTo(virtual, 6)
    expect(last(run.eA)).toBeCloseTo((p.kB * (p.rA - p.rB)) / (p.kA + p.kB), 6)
    expect(last(run.eA)).toBeCloseTo(2, 6)
    expect(last(run.eB)).toBeCloseTo(-8, 6)
  })

  it('row 20: with output limits both saturate and q is left to the disturbance (stalemate)', () => {
    const p: TugLoopParams = { kA: 5, kB: 5, rA: 10, rB: -10, d: 2 }
    const run = simulateIntegrating(p, 10000, 0.01, { max: 50 })
    // REFERENCE §7 check row 20, derived/simulated: oA = +max, oB = −max, q = d, eA = rA − d, eB = rB − d
    expect(last(run.oA)).toBeCloseTo(50, 9)
    expect(last(run.oB)).toBeCloseTo(-50, 9)
    expect(last(run.q)).toBeCloseTo(p.d, 9)
    expect(last(run.eA)).toBeCloseTo(p.rA - p.d, 9)
    expect(last(run.eA)).toBeCloseTo(8, 9)
    expect(last(run.eB)).toBeCloseTo(-12, 9)
    expect(Math.max(...run.oA.map(Math.abs), ...run.oB.map(Math.abs))).toBeLessThanOrEqual(50)
  })

  it('without limits the same conflict escalates past any limit', () => {
    const run = simulateIntegrating({ kA: 5, kB: 5, rA: 10, rB: -10, d: 2 }, 10000, 0.01)
    // REFERENCE §7, derived: without limits outputs run away in opposite directions
    expect(last(run.oA)).toBeGreaterThan(1000)
    expect(last(run.oB)).toBeLessThan(-1000)
  })
})

describe('tugPicture', () => {
  it('holds the situation between the aims while the efforts oppose and stay large', () => {
    const pic = tugPicture({ importance: 10 }, { importance: 10 }, false)
    if (!pic.hasPull) throw new Error('expected a pull')
    expect(pic.gains).toEqual({ kA: 50, kB: 50 })
    expect(pic.stuck.rA).toBe(stuckAims.rA)
    expect(pic.stuck.rB).toBe(stuckAims.rB)
    expect(pic.stuck.q).toHaveLength(picturePoints)
    const lo = Math.min(stuckAims.rA, stuckAims.rB), hi = Math.max(stuckAims.rA, stuckAims.rB)
    expect(pic.stuck.q.slice(1).every((q) => q > lo && q < hi)).toBe(true)
    expect(last(pic.stuck.oA)).toBeGreaterThan(200)
    expect(last(pic.stuck.oB)).toBeLessThan(-200)
    expect(pic.summary.stuckEffort).toBeCloseTo(500, 6) // REFERENCE §7 check values, derived
    expect(pic.meeting).toBeNull()
    expect(pic.summary.meetingEffort).toBeNull()
    expect(pic.summary.ratio).toBeNull()
  })

  it('with a meeting point, effort falls from the stuck level to a small fraction of it', () => {
    const pic = tugPicture({ importance: 10 }, { importance: 10 }, true)
    if (!pic.hasPull || !pic.meeting) throw new Error('expected a meeting series')
    expect(pic.meeting.rA).toBe(meetingAim)
    expect(pic.meeting.rB).toBe(meetingAim)
    expect(pic.meeting.effort[0]).toBeCloseTo(500, 6)
    expect(last(pic.meeting.effort)).toBeLessThan(0.02 * 500)
    expect(pic.summary.meetingEffort).toBeCloseTo(4.95, 2) // REFERENCE §7 check values, derived: effort ≈ 4.95
    expect(pic.summary.ratio).toBeCloseTo(1 / 101, 6) // derived: 1/(1 + 2k) for equal gains k = 50
  })

  it('keeps the meeting-point effort under a tenth of the stuck effort for every pair of importances 1–10', () => {
    for (let a = 1; a <= 10; a++) {
      for (let b = 1; b <= 10; b++) {
        const pic = tugPicture({ importance: a }, { importance: b }, true)
        if (!pic.hasPull) throw new Error(`expected a pull for ${a}/${b}`)
        // derived from the closed form: the largest ratio is 1/11, at importance 1 and 1 (k = 5 each)
        expect(pic.summary.ratio).toBeLessThan(0.1)
      }
    }
  })

  it.each([
    ['a missing second want', { importance: 7 }, undefined, 1],
    ['importance 0 on one side', { importance: 0 }, { importance: 8 }, 1],
    ['no importance given', {}, { importance: 8 }, 1],
    ['no wants at all', undefined, undefined, 0],
  ])('has no pull to draw with %s, and no NaN or Infinity', (_label, a, b, loops) => {
    for (const meeting of [true, false]) {
      const pic = tugPicture(a, b, meeting)
      expect(pic.hasPull).toBe(false)
      expect(pic.loops).toBe(loops)
      expect(pic.stuck).toBeNull()
      expect(numbersIn(pic).every(Number.isFinite)).toBe(true)
      expect(JSON.stringify(pic)).not.toMatch(/NaN|Infinity/)
    }
  })

  it('gives only finite numbers for any pair of importances', () => {
    for (const a of [0.5, 1, 5, 10, 12]) {
      for (const b of [0.5, 3, 10]) {
        expect(numbersIn(tugPicture({ importance: a }, { importance: b }, true)).every(Number.isFinite)).toBe(true)
      }
    }
  })
})

import { describe, expect, it } from 'vitest'
import { cutOffC, jacobsonTruaxClass, reliableChangeIndex, reliableChangeThreshold, sdiffFromSe } from '../../../../shared/scoring/reliableChange'

describe('Jacobson & Truax reliable change index', () => {
  it('reproduces the open-textbook example: SEM 3.07 → Sdiff 4.34, threshold 8.51, 24→35 is reliable', () => {
    // Wodrich, Univ. of Arizona open textbook, Appendix E (REFERENCE.md row 9); formula Jacobson & Truax 1991
    const { sdiff, threshold } = sdiffFromSe(3.07)
    expect(sdiff).toBeCloseTo(4.34, 2)
    expect(threshold).toBeCloseTo(8.51, 2)
    const { rc, reliable } = reliableChangeIndex(24, 35, sdiff)
    expect(rc).toBeCloseTo(2.53, 2)
    expect(reliable).toBe(true)
  })

  it('computes SE, Sdiff and the threshold from s1 7.6 and rxx 0.95', () => {
    // LDQ thesis inputs (REFERENCE.md row 10), recomputed: SE = 7.6·√0.05
    const r = reliableChangeThreshold({ s1: 7.6, rxx: 0.95 })
    expect(r.se).toBeCloseTo(7.6 * Math.sqrt(0.05), 10)
    expect(r.se).toBeCloseTo(1.699, 3)
    expect(r.sdiff).toBeCloseTo(2.403, 3)
    expect(r.threshold).toBeCloseTo(4.71, 2)
  })

  it('does not call a 10-point fall reliable when s1 10 and rxx 0.84', () => {
    // Jacobson & Truax 1991 formula, computed (REFERENCE.md row 11): SE 4, Sdiff √32, RC −1.77
    const { se, sdiff, threshold } = reliableChangeThreshold({ s1: 10, rxx: 0.84 })
    expect(se).toBeCloseTo(4, 10)
    expect(sdiff).toBeCloseTo(Math.sqrt(32), 10)
    expect(threshold).toBeCloseTo(11.09, 2)
    const { rc, reliable } = reliableChangeIndex(30, 20, sdiff)
    expect(rc).toBeCloseTo(-1.77, 2)
    expect(reliable).toBe(false)
  })

  it('refuses norms that would divide by zero or take a root of a negative', () => {
    expect(() => reliableChangeThreshold({ s1: 0, rxx: 0.8 })).toThrow(RangeError)
    expect(() => reliableChangeThreshold({ s1: 5, rxx: 1 })).toThrow(RangeError)
    expect(() => sdiffFromSe(0)).toThrow(RangeError)
  })
})

describe('cut-off c', () => {
  it('is 85/9 for M0 5, s0 4, M1 15, s1 5', () => {
    // Jacobson & Truax 1991 c = (s0·M1 + s1·M0)/(s0 + s1), computed (REFERENCE.md row 12)
    expect(cutOffC({ m0: 5, s0: 4, m1: 15, s1: 5 })).toBeCloseTo(85 / 9, 10)
    expect(cutOffC({ m0: 5, s0: 4, m1: 15, s1: 5 })).toBeCloseTo(9.444, 3)
  })

  it('lies midway when both SDs are equal', () => {
    expect(cutOffC({ m0: 4, s0: 3, m1: 16, s1: 3 })).toBe(10)
  })
})

describe('the four outcome classes', () => {
  // Norms here are invented for the test only; the classes follow Jacobson & Truax 1991 (BMC additional file, REFERENCE.md §3).
  const norms = { m0: 5, s0: 4, m1: 15, s1: 5, rxx: 0.9 }
  // threshold = 1.96·5·√2·√0.1 ≈ 4.38; c ≈ 9.44
  it.each([
    [18, 8, 'recovered'],
    [18, 12, 'improved'],
    [18, 16, 'unchanged'],
    [10, 16, 'deteriorated'],
  ] as const)('%i → %i is %s', (pre, post, cls) => {
    expect(jacobsonTruaxClass(pre, post, norms)).toBe(cls)
  })
})

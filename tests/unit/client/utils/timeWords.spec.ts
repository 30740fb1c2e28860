import fc from 'fast-check'
import { format } from 'date-fns'
import { describe, expect, it } from 'vitest'
import { clockTime, timeAgo } from '../../../../client/utils/timeWords'

const MINUTE = 60_000
const HOUR = 60 * MINUTE
const DAY = 24 * HOUR
const NOW = Date.UTC(2026, 11, 3, 12, 0)

describe('clockTime', () => {
  it("matches date-fns 'HH:mm' in the device's zone, which the journal's other screens use", () => {
    fc.assert(fc.property(fc.integer({ min: 0, max: 4_102_444_800_000 }), (at) => clockTime(at) === format(at, 'HH:mm')), { numRuns: 2000 })
  })

  it('pads hours and minutes to two digits', () => {
    expect(clockTime(new Date(2026, 0, 5, 7, 5).getTime())).toBe('07:05')
    expect(clockTime(new Date(2026, 0, 5, 0, 0).getTime())).toBe('00:00')
    expect(clockTime(new Date(2026, 0, 5, 23, 59).getTime())).toBe('23:59')
  })
})

describe('timeAgo', () => {
  it('words the largest whole unit that fits, rounding down', () => {
    expect(timeAgo(NOW - 30_000, NOW)).toBe('just now')
    expect(timeAgo(NOW - MINUTE, NOW)).toBe('1 minute ago')
    expect(timeAgo(NOW - 59 * MINUTE, NOW)).toBe('59 minutes ago')
    expect(timeAgo(NOW - 5 * HOUR, NOW)).toBe('5 hours ago')
    expect(timeAgo(NOW - DAY, NOW)).toBe('1 day ago')
    expect(timeAgo(NOW - 6 * DAY, NOW)).toBe('6 days ago')
    // The reminder shows from 14 days on (client/db/backupRepository.ts).
    expect(timeAgo(NOW - 14 * DAY, NOW)).toBe('2 weeks ago')
    expect(timeAgo(NOW - 29 * DAY, NOW)).toBe('4 weeks ago')
    expect(timeAgo(NOW - 45 * DAY, NOW)).toBe('1 month ago')
    expect(timeAgo(NOW - 200 * DAY, NOW)).toBe('6 months ago')
    expect(timeAgo(NOW - 800 * DAY, NOW)).toBe('2 years ago')
  })

  it('reads a time in the future (a device clock set back) as just now, never "in 3 days"', () => {
    expect(timeAgo(NOW + 3 * DAY, NOW)).toBe('just now')
  })
})

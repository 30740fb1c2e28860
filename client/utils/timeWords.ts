/*
 * Time words for the first screen. Today's cards use these rather than date-fns, whose format and locale code
 * (about 6 KB gzip) would otherwise load with the first route; the pages opened later keep date-fns.
 */

const two = (n: number) => String(n).padStart(2, '0')

/** The device's local clock time, 24-hour: "07:05" (what date-fns formats as 'HH:mm'). */
export function clockTime(at: number): string {
  const d = new Date(at)
  return `${two(d.getHours())}:${two(d.getMinutes())}`
}

const MINUTE = 60_000
const HOUR = 60 * MINUTE
const DAY = 24 * HOUR
const ago = new Intl.RelativeTimeFormat('en', { numeric: 'always' })

/** How long ago, in the largest whole unit that fits: "3 days ago", "2 weeks ago", "1 month ago". */
export function timeAgo(at: number, now = Date.now()): string {
  const past = Math.max(0, now - at)
  if (past < MINUTE) return 'just now'
  const [n, unit]: [number, Intl.RelativeTimeFormatUnit] =
    past < HOUR ? [past / MINUTE, 'minute']
      : past < DAY ? [past / HOUR, 'hour']
        : past < 7 * DAY ? [past / DAY, 'day']
          : past < 30 * DAY ? [past / (7 * DAY), 'week']
            : past < 365 * DAY ? [past / (30 * DAY), 'month']
              : [past / (365 * DAY), 'year']
  return ago.format(-Math.floor(n), unit)
}

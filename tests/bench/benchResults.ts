/** Figures the bench page hands back to the runner; all times in milliseconds. */
export interface Spread {
  median: number
  p95: number
  max: number
}

export interface QueryTiming {
  label: string
  hits: number
  /** Median of the timed rounds for this one query. */
  ms: number
  /** The first, untimed-for-summary round, before caches and the JIT warm up. */
  coldMs: number
}

export interface BenchResults {
  userAgent: string
  /** When true, performance.now() is precise to microseconds rather than a tenth of a millisecond. */
  crossOriginIsolated: boolean
  /** Idle pause between the bulk add and the first search. */
  settleMs: number
  save: {
    count: number
    dexie: Spread
    /** Raw put into a store with the same indexes as the app's entries table. */
    rawIndexed: Spread
    /** Raw put into a store with no indexes, to show what the multi-entry indexes cost. */
    rawPlain: Spread
    ratio: number
  }
  /** createEntry again, once the journal holds the generated entries. */
  saveWhenFull: Spread
  generate: {
    count: number
    moments: number
    tugs: number
    distinctWords: number
    buildMs: number
    bulkAddMs: number
  }
  search: {
    rounds: number
    queries: QueryTiming[]
    warm: Spread
    cold: Spread
  }
  listAll: {
    rows: number
    coldMs: number
    warm: Spread
  }
  storageBytes?: number
}

/** The outbox drain against the real server: figures from the page; the server-side checks are the runner's. */
export interface OutboxResults {
  count: number
  linkId: string
  entryIds: string[]
  /** Outbox rows after queueing, before the drain. */
  queued: number
  createMs: number
  queueMs: number
  /** All drainOutbox calls until the outbox was empty. */
  drainMs: number
  drains: { sent: number; deferred: number; failed: number; paused: boolean; ms: number }[]
  /** Outbox rows still there after the last drain. */
  left: number
  /** Entries whose share over the link reads 'shared' at the entry's version. */
  sharedLocally: number
  /** Share PUTs seen in the page's resource timing. */
  requests: number
  /** Each PUT from fetch start to the last byte of the response. */
  roundTrip?: Spread
  roundTripSumMs: number
  /** From one PUT's response to the next PUT's start: the device's work per row between requests. */
  between?: Spread
}

/** Nearest-rank percentile of already-collected samples. */
export function percentile(samples: number[], p: number): number {
  const sorted = [...samples].sort((a, b) => a - b)
  const rank = Math.max(1, Math.ceil((p / 100) * sorted.length))
  return sorted[rank - 1] ?? Number.NaN
}

export function spread(samples: number[]): Spread {
  return { median: percentile(samples, 50), p95: percentile(samples, 95), max: Math.max(...samples) }
}

/** The 90-day appointment summary built in the page: read from Dexie, then the PDF with Lora embedded. */
export interface SummaryBenchResults {
  runs: number
  days: number
  /** Moments and tugs in the PDF. */
  entries: number
  measures: number
  /** Reading the period's entries and questionnaires from Dexie. */
  gather: Spread
  /** Reading plus building the PDF (fonts from the page's cache after the untimed first build). */
  total: Spread
  bytes: number
  pages: number
}

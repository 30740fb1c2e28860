import type { PatternPeriod } from './periodRange'

export interface PeriodPhrase {
  /** Opens a summary sentence: "Over the last 30 days". */
  lead: string
  /** The whole summary when the period holds no moments or tugs. */
  nothingYet: string
}

const leads: Record<PatternPeriod, string> = {
  '7d': 'Over the last 7 days',
  '30d': 'Over the last 30 days',
  '90d': 'Over the last 90 days',
  '1y': 'Over the last year',
  all: 'So far',
}

/** The words every pattern summary shares for its period. */
export function periodPhrase(period: PatternPeriod): PeriodPhrase {
  return {
    lead: leads[period],
    nothingYet: period === 'all' ? 'Nothing recorded yet.' : 'Nothing recorded in this period yet.',
  }
}

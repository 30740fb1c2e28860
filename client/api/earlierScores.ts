import { earlierScoreViewSchema } from '@shared/schemas/measure.schema'
import { z } from 'zod'
import { request } from './http'

const earlierScoresResponse = z.object({ scores: z.array(earlierScoreViewSchema) })

/** Earlier scores the therapist entered for this person over one of their links. */
export const fetchEarlierScores = (linkId: string) => request('GET', `/api/links/${encodeURIComponent(linkId)}/earlier-scores`, undefined, earlierScoresResponse)

import { earlierScoresResponseSchema, linkMeasuresSchema } from '@shared/schemas/measureReport.schema'
import { z } from 'zod'
import { download, request } from './http'

const base = (linkId: string) => `/api/therapist/links/${encodeURIComponent(linkId)}`
const okResponse = z.object({ ok: z.literal(true) })

export const fetchLinkMeasures = (linkId: string) => request('GET', `${base(linkId)}/measures`, undefined, linkMeasuresSchema)
export const fetchEarlierScores = (linkId: string) => request('GET', `${base(linkId)}/earlier-scores`, undefined, earlierScoresResponseSchema)
export const deleteEarlierScore = (linkId: string, id: string) => request('DELETE', `${base(linkId)}/earlier-scores/${encodeURIComponent(id)}`, undefined, okResponse)

/** Uploads a CSV of earlier scores; a bad file raises ApiError 400 `invalid_csv` with `details.rows`, and nothing is stored. */
export function uploadEarlierScores(linkId: string, file: File) {
  const form = new FormData()
  form.append('file', file, file.name)
  return request('POST', `${base(linkId)}/earlier-scores`, form, earlierScoresResponseSchema)
}

export const downloadMeasuresCsv = (linkId: string) => download(`${base(linkId)}/measures.csv`, 'rungs-measures.csv')
export const downloadMeasuresFhir = (linkId: string) => download(`${base(linkId)}/measures/fhir`, 'rungs-measures.fhir.json')

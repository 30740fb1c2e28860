import { linkPreviewSchema, personLinkRowSchema } from '@shared/schemas/link.schema'
import { z } from 'zod'
import { request } from './http'

const previewResponse = z.object({ preview: linkPreviewSchema })
const linkResponse = z.object({ link: personLinkRowSchema })
const linksResponse = z.object({ links: z.array(personLinkRowSchema) })
const endResponse = z.object({ state: z.literal('ended'), endedAt: z.string() })

export const previewLink = (code: string) => request('POST', '/api/person/links/preview', { code }, previewResponse)
export const confirmLink = (code: string) => request('POST', '/api/person/links', { code }, linkResponse)
export const fetchLinks = () => request('GET', '/api/person/links', undefined, linksResponse)
export const endLink = (linkId: string) => request('POST', `/api/links/${encodeURIComponent(linkId)}/end`, undefined, endResponse)

import { z } from 'zod'

// The parts of the FHIR R4 (4.0.1) definitions these exports use, with their cardinalities: required (1..1) fields are
// required here, and value[x] must hold exactly one value (hl7.org/fhir/R4 QuestionnaireResponse, Observation, Bundle).
const coding = z.object({ system: z.string().url(), code: z.string().min(1), display: z.string().optional() }).strict()
const reference = z.object({ reference: z.string().optional(), display: z.string().optional() }).strict()
const fhirId = z.string().regex(/^[A-Za-z0-9\-.]{1,64}$/)
const dateTime = z.string().regex(/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}(\.\d+)?(Z|[+-]\d{2}:\d{2})$/)

const answer = z
  .object({ valueCoding: coding.optional(), valueInteger: z.number().int().optional(), valueString: z.string().optional() })
  .strict()
  .refine((a) => Object.keys(a).filter((k) => k.startsWith('value')).length === 1, 'answer.value[x] holds exactly one value')

export const qrItemSchema = z.object({ linkId: z.string().min(1), text: z.string().optional(), answer: z.array(answer).optional() }).strict()

export const questionnaireResponseSchema = z
  .object({
    resourceType: z.literal('QuestionnaireResponse'),
    id: fhirId,
    questionnaire: z.string().url().optional(),
    status: z.enum(['in-progress', 'completed', 'amended', 'entered-in-error', 'stopped']),
    subject: reference.optional(),
    authored: dateTime.optional(),
    item: z.array(qrItemSchema).optional(),
  })
  .strict()

export const observationSchema = z
  .object({
    resourceType: z.literal('Observation'),
    id: fhirId,
    status: z.enum(['registered', 'preliminary', 'final', 'amended', 'corrected', 'cancelled', 'entered-in-error', 'unknown']),
    category: z.array(z.object({ coding: z.array(coding) }).strict()).optional(),
    code: z.object({ coding: z.array(coding).min(1), text: z.string().optional() }).strict(),
    subject: reference.optional(),
    effectiveDateTime: dateTime.optional(),
    valueInteger: z.number().int().optional(),
    interpretation: z.array(z.object({ text: z.string() }).strict()).optional(),
    derivedFrom: z.array(reference).optional(),
    note: z.array(z.object({ text: z.string() }).strict()).optional(),
  })
  .strict()

export const bundleSchema = z
  .object({
    resourceType: z.literal('Bundle'),
    type: z.enum(['document', 'message', 'transaction', 'transaction-response', 'batch', 'batch-response', 'history', 'searchset', 'collection']),
    timestamp: dateTime.optional(),
    entry: z.array(z.object({ fullUrl: z.string().regex(/^urn:uuid:[0-9a-f-]{36}$/), resource: z.union([questionnaireResponseSchema, observationSchema]) }).strict()),
  })
  .strict()

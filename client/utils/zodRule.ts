import type { ZodType } from 'zod'

/** Turns a shared zod schema into a Quasar field rule, so forms and the server say the same thing. */
export function zodRule(schema: ZodType) {
  return (value: unknown): true | string => {
    const r = schema.safeParse(value)
    return r.success ? true : (r.error.issues[0]?.message ?? 'Please check this field.')
  }
}

import fc from 'fast-check'

/** Strings people and attackers send: unicode edge cases, lone surrogates, direction marks, zero-width, injections. */
const nastyConstants = [
  '', ' ', '\u0000', '\uD800', '\uDFFF', 'a\uD83D', '\uDE00b', '😀', '👩🏽‍⚕️', '\u202Eevil\u202C', '\u200F\u05E9\u05DC\u05D5\u05DD',
  '\u200B\u200C\u200D\uFEFF', 'é', 'e\u0301', '\u{10FFFF}', 'null', 'undefined', 'true', '0', '-1', '1e309', 'NaN', '9007199254740993',
  '<script>alert(1)</script>', "'; DROP TABLE users; --", '../../../etc/passwd', '%00', '%', '%E0%A4%A', '{{7*7}}', '${7*7}',
  '=HYPERLINK("x")', '__proto__', 'constructor', 'prototype', '2026-02-30T25:61:00Z', 'ZZZZ-ZZZZ', 'a@b', 'x'.repeat(257),
]

export const nastyString: fc.Arbitrary<string> = fc.oneof(
  { weight: 3, arbitrary: fc.constantFrom(...nastyConstants) },
  { weight: 3, arbitrary: fc.string({ maxLength: 40 }) },
  { weight: 2, arbitrary: fc.string({ unit: 'binary', maxLength: 40 }) },
  { weight: 1, arbitrary: fc.uuid() },
  { weight: 1, arbitrary: fc.emailAddress() },
  { weight: 1, arbitrary: fc.date({ noInvalidDate: true }).map((d) => d.toISOString()) },
)

/** Up to ~100 kB of one character, some of them several UTF-8 bytes each; kept out of nastyString so bodies stay mostly small. */
export const hugeString: fc.Arbitrary<string> = fc
  .tuple(fc.constantFrom('x', 'é', '😀', '\u200B', '\uD800', 'ab\u202E'), fc.integer({ min: 1_000, max: 100_000 }))
  .map(([c, n]) => c.repeat(Math.ceil(n / c.length)))

const nastyNumber = fc.oneof(
  fc.integer(),
  fc.double(),
  fc.constantFrom(0, -0, -1, 1, 100, 101, 2 ** 31, 2 ** 53 + 1, Number.MAX_VALUE, 1e-300),
)

export const pollutionKeys = ['__proto__', 'constructor', 'prototype', 'toString', 'valueOf', 'hasOwnProperty']

export const fuzzKey = fc.oneof(
  { weight: 2, arbitrary: fc.constantFrom(...pollutionKeys) },
  { weight: 2, arbitrary: fc.constantFrom('id', 'email', 'password', 'version', 'payload', 'text', 'code', 'at', 'role', 'read', 'toDiscuss', 'kind', 'body', 'disabled', 'checks', 'note') },
  { weight: 2, arbitrary: fc.string({ maxLength: 12 }) },
  { weight: 1, arbitrary: nastyString },
)

/** Any JSON-ish value, with own `__proto__`/`constructor` keys possible at every depth. */
export const fuzzValue: fc.Arbitrary<unknown> = fc.letrec<{ value: unknown }>((tie) => ({
  value: fc.oneof(
    { depthSize: 'small', withCrossShrink: true },
    nastyString,
    nastyNumber,
    fc.boolean(),
    fc.constant(null),
    fc.array(tie('value'), { maxLength: 5 }),
    // Object.fromEntries defines "__proto__" as an own key, as JSON.parse on the server will.
    fc.array(fc.tuple(fuzzKey, tie('value')), { maxLength: 5 }).map((pairs) => Object.fromEntries(pairs)),
  ),
})).value

type Mutation = (o: Record<string, unknown>) => unknown

const mutation: fc.Arbitrary<Mutation> = fc.oneof(
  // Drop a field.
  fc.nat().map((n): Mutation => (o) => { const keys = Object.keys(o); if (keys.length) delete o[keys[n % keys.length]!]; return o }),
  // Give a field a wrong value (wrong type, unicode) or a huge string.
  fc.tuple(fc.nat(), fuzzValue).map(([n, v]): Mutation => (o) => { const keys = Object.keys(o); if (keys.length) o[keys[n % keys.length]!] = v; return o }),
  fc.tuple(fc.nat(), hugeString).map(([n, v]): Mutation => (o) => { const keys = Object.keys(o); o[keys.length ? keys[n % keys.length]! : 'text'] = v; return o }),
  // Add a key, prototype keys included, nested.
  fc.tuple(fuzzKey, fuzzValue).map(([k, v]): Mutation => (o) => Object.assign(o, Object.fromEntries([[k, v]]))),
  fc.constant<Mutation>((o) => Object.assign(o, Object.fromEntries([['__proto__', { polluted: 'yes', isAdmin: true }], ['constructor', { prototype: { polluted: 'yes' } }]]))),
  // An array where an object belongs.
  fc.constant<Mutation>((o) => [o]),
)

function deepCopy<T>(v: T): T {
  return JSON.parse(JSON.stringify(v)) as T
}

export interface FuzzBody {
  kind: 'json' | 'raw' | 'multipart' | 'form' | 'none'
  /** Text for json/raw/form; file content for multipart. */
  text?: string
  contentType?: string
}

const malformedJson = fc.constantFrom(
  '{', '{"a":', '[1,2', '{"a":1,}', "{'a':1}", 'undefined', 'NaN', '\uFEFF{}', '{"a":"\uD800"}', '{"__proto__":', '{}{}',
  '{'.repeat(3000) + '}'.repeat(3000), '"just a string"', '42', 'null', 'true', '[]',
)

/** A request body: a valid template bent out of shape, random JSON, broken JSON, too-large JSON, multipart or none. */
export function fuzzBody(templates: object[]): fc.Arbitrary<FuzzBody> {
  const template = templates.length ? fc.constantFrom(...templates) : fc.constant({})
  return fc.oneof(
    { weight: 10, arbitrary: fc.tuple(template, fc.array(mutation, { minLength: 0, maxLength: 3 })).map(([t, ms]) => ({ kind: 'json' as const, text: JSON.stringify(ms.reduce<unknown>((o, m) => (o && typeof o === 'object' && !Array.isArray(o) ? m(o as Record<string, unknown>) : o), deepCopy(t))) })) },
    { weight: 6, arbitrary: fuzzValue.map((v) => ({ kind: 'json' as const, text: JSON.stringify(v) ?? 'null' })) },
    { weight: 2, arbitrary: malformedJson.map((text) => ({ kind: 'raw' as const, text, contentType: 'application/json' })) },
    // Just over the 256 kB JSON limit.
    { weight: 1, arbitrary: fc.integer({ min: 262_200, max: 300_000 }).map((n) => ({ kind: 'raw' as const, text: JSON.stringify({ text: 'y'.repeat(n) }), contentType: 'application/json' })) },
    { weight: 2, arbitrary: fc.constantFrom('application/json; charset=utf-16', 'text/plain', 'application/x-www-form-urlencoded', 'application/xml').chain((contentType) => nastyString.map((text) => ({ kind: 'raw' as const, text, contentType }))) },
    { weight: 2, arbitrary: fc.oneof(nastyString, fc.constantFrom('date,measure,total\n2026-08-03,PHQ-9,17\n', 'date,measure,total\n2026-13-45,PHQ-9,999\n', 'a,b\n"unterminated', '=cmd|/c calc,1,2\n')).map((text) => ({ kind: 'multipart' as const, text })) },
    { weight: 2, arbitrary: fc.constant({ kind: 'none' as const }) },
  )
}

/** Query strings, with repeated keys, prototype keys, bracket keys and nasty values. */
export const fuzzQuery: fc.Arbitrary<[string, string][]> = fc.array(
  fc.tuple(
    fc.oneof(fuzzKey, fc.constantFrom('version', 'format', 'from', 'to', 'q', 'limit', 'a[b]', '__proto__[x]', 'constructor[prototype][x]', 'version[]')),
    fc.oneof(nastyString, hugeString.map((s) => s.slice(0, 2_000)), fc.constantFrom('1', '-1', '0', '1.5', '99999999999999999999', '')),
  ),
  { maxLength: 4 },
)

/** Path parameter values: real ids of the fixture, other UUIDs, and things that are not UUIDs at all. */
export function fuzzId(real: string[]): fc.Arbitrary<string> {
  return fc.oneof(
    { weight: 4, arbitrary: real.length ? fc.constantFrom(...real) : fc.uuid() },
    { weight: 2, arbitrary: fc.uuid() },
    { weight: 3, arbitrary: nastyString.filter((s) => s.length > 0) },
    { weight: 1, arbitrary: hugeString.map((s) => s.slice(0, 3_000)) },
    { weight: 1, arbitrary: fc.integer().map(String) },
  )
}

/** encodeURIComponent that also carries lone surrogates, as the (invalid) UTF-8 bytes a raw client would send. */
export function encodePart(s: string): string {
  let out = ''
  for (const piece of s.split(/([\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF])/)) {
    if (piece.length === 1 && /[\uD800-\uDFFF]/.test(piece)) {
      const u = piece.charCodeAt(0)
      out += [0xe0 | (u >> 12), 0x80 | ((u >> 6) & 63), 0x80 | (u & 63)].map((b) => `%${b.toString(16).toUpperCase()}`).join('')
    } else out += encodeURIComponent(piece)
  }
  return out
}

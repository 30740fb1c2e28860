// zod 4 probes `new Function` when an object schema is built, to compile a faster parser. Under Rungs' CSP (no
// 'unsafe-eval') that probe is blocked and reported as a violation, so it is switched off before any schema exists.
// main.ts imports this file first for that reason.
//
// zod keeps its settings in one object on `globalThis.__zod_globalConfig` (shared by every copy of zod, and what
// `z.config()` writes to). Setting it here, without importing zod, keeps zod off the first screen: the schemas load
// later with the code that parses. This works whichever of the two runs first; tests/unit/client/boot/zodConfig.spec.ts
// checks that zod still reads it.
const holder = globalThis as { __zod_globalConfig?: { jitless?: boolean } }
Object.assign((holder.__zod_globalConfig ??= {}), { jitless: true })
// An ES module (not a script), so it is imported once for its effect.
export {}

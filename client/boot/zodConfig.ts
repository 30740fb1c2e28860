import { z } from 'zod'

// zod 4 probes `new Function` when an object schema is built, to compile a faster parser. Under Rungs' CSP (no
// 'unsafe-eval') that probe is blocked and reported as a violation, so it is switched off before any schema exists.
// main.ts imports this file first for that reason.
z.config({ jitless: true })

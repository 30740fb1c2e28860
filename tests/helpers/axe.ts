import fs from 'node:fs'
import { createRequire } from 'node:module'
import type { Page } from 'playwright-core'

const require = createRequire(import.meta.url)
// Injected by evaluate: the strict CSP blocks addScriptTag.
const axeSource = fs.readFileSync(require.resolve('axe-core/axe.min.js'), 'utf8')

interface Violation { id: string; impact: string; help: string; nodes: { target: string[] }[] }

/** Runs axe-core on the page and returns its serious and critical violations, one readable line each. */
export async function seriousViolations(page: Page): Promise<string[]> {
  await page.evaluate(axeSource)
  const violations = await page.evaluate(async () => {
    const axe = (window as unknown as { axe: { run: (ctx: Document, o: object) => Promise<{ violations: Violation[] }> } }).axe
    return (await axe.run(document, { resultTypes: ['violations'] })).violations
  })
  return violations
    .filter((v: Violation) => v.impact === 'serious' || v.impact === 'critical')
    .map((v: Violation) => `${v.id} (${v.impact}): ${v.help} at ${v.nodes.map((n) => n.target.join(' ')).join(', ')}`)
}

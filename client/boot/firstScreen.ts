// index.html holds Today rendered at build time (client/build/firstScreenHtml.ts), which a person can already use a
// little before the app has started: type into the form, or tap Help now. The app's mount replaces that markup, so
// what they did is read just before and carried into the app's own screen.

/** What was done on the prerendered screen. */
export interface EarlyUse {
  text: string
  focused: boolean
  helpAsked: boolean
}

const HELP_ASKED = 'rungs-help-asked'

export function readEarlyUse(doc: Document = document): EarlyUse {
  const fields = [...doc.querySelectorAll<HTMLTextAreaElement>('#app .first-screen textarea')]
  const field = fields.find((f) => f === doc.activeElement) ?? fields.find((f) => f.value)
  return { text: field?.value ?? '', focused: !!field && field === doc.activeElement, helpAsked: doc.documentElement.classList.contains(HELP_ASKED) }
}

/**
 * Resolves with the element as soon as it is in the app's own screen: a page behind Suspense is inserted a moment after
 * mount, and a MutationObserver answers in the same task, before any key the person presses meanwhile could go astray.
 */
function appElement<T extends Element>(doc: Document, selector: string, waitMs = 3_000): Promise<T | null> {
  const find = () => doc.querySelector<T>(`#app > :not(.first-screen) ${selector}`)
  const now = find()
  if (now) return Promise.resolve(now)
  return new Promise((resolve) => {
    const done = (el: T | null) => {
      observer.disconnect()
      clearTimeout(timer)
      resolve(el)
    }
    const observer = new MutationObserver(() => {
      const el = find()
      if (el) done(el)
    })
    observer.observe(doc.body, { childList: true, subtree: true })
    const timer = setTimeout(() => done(find()), waitMs)
  })
}

export async function carryEarlyUse(early: EarlyUse, doc: Document = document): Promise<void> {
  if (early.helpAsked) {
    doc.documentElement.classList.remove(HELP_ASKED)
    ;(await appElement<HTMLElement>(doc, '[data-test=help-now]'))?.click()
    return
  }
  if (!early.text && !early.focused) return
  const field = await appElement<HTMLTextAreaElement>(doc, '[data-test=moment-body]')
  if (!field) return
  // Anything the draft brought in meanwhile is kept in front of what was typed here.
  if (early.text) {
    field.value = field.value ? `${field.value}\n${early.text}` : early.text
    field.dispatchEvent(new Event('input', { bubbles: true }))
  }
  if (early.focused) {
    field.focus()
    field.setSelectionRange(field.value.length, field.value.length)
  }
}

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

/** Resolves with the element once it is in the app's own screen (a page behind Suspense renders a moment after mount). */
function appElement<T extends Element>(doc: Document, selector: string, frames = 120): Promise<T | null> {
  return new Promise((resolve) => {
    const look = (left: number) => {
      const el = doc.querySelector<T>(`#app > :not(.first-screen) ${selector}`)
      if (el || left <= 0) resolve(el)
      else requestAnimationFrame(() => look(left - 1))
    }
    look(frames)
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

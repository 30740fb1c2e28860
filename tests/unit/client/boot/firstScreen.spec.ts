import { afterEach, describe, expect, it } from 'vitest'
import { carryEarlyUse, readEarlyUse } from '@/boot/firstScreen'

// index.html's prerendered Today, then the app's own screen put in its place as Vue's mount does.
function prerendered(): HTMLTextAreaElement {
  document.body.innerHTML = '<div id="app"><div class="first-screen"><div class="q-layout"><button data-test="help-now">Help now</button><textarea data-test="moment-body"></textarea></div></div></div>'
  return document.querySelector('textarea')!
}
function mountApp(): { field: HTMLTextAreaElement; help: HTMLButtonElement } {
  document.querySelector('#app')!.innerHTML = '<div class="q-layout"><button data-test="help-now">Help now</button><textarea data-test="moment-body"></textarea></div>'
  return { field: document.querySelector('textarea')!, help: document.querySelector('button')! }
}

afterEach(() => {
  document.body.innerHTML = ''
  document.documentElement.classList.remove('rungs-help-asked')
})

describe('what was done on the prerendered first screen', () => {
  it('carries typed text into the app form as input, with the cursor at its end', async () => {
    const early = prerendered()
    early.focus()
    early.value = 'The bus was late and I snapped'
    const use = readEarlyUse()
    expect(use).toEqual({ text: 'The bus was late and I snapped', focused: true, helpAsked: false })
    const { field } = mountApp()
    const typed: string[] = []
    field.addEventListener('input', () => typed.push(field.value))
    await carryEarlyUse(use)
    expect(field.value).toBe('The bus was late and I snapped')
    expect(typed).toEqual(['The bus was late and I snapped'])
    expect(document.activeElement).toBe(field)
    expect(field.selectionStart).toBe(field.value.length)
  })

  it('keeps a draft the app restored first, and adds what was typed after it', async () => {
    prerendered().value = 'and then I left'
    const use = readEarlyUse()
    const { field } = mountApp()
    field.value = 'At the meeting I went quiet'
    await carryEarlyUse(use)
    expect(field.value).toBe('At the meeting I went quiet\nand then I left')
  })

  it("opens the app's Help now when it was tapped before the app started", async () => {
    prerendered()
    document.documentElement.classList.add('rungs-help-asked')
    const use = readEarlyUse()
    expect(use.helpAsked).toBe(true)
    const { help } = mountApp()
    let opened = 0
    help.addEventListener('click', () => opened++)
    await carryEarlyUse(use)
    expect(opened).toBe(1)
    expect(document.documentElement.classList.contains('rungs-help-asked')).toBe(false)
  })

  it('waits for a page the app inserts after mounting (behind Suspense) and fills it the moment it is there', async () => {
    prerendered().value = 'Said yes again when I meant no'
    const use = readEarlyUse()
    document.querySelector('#app')!.innerHTML = '<div class="q-layout"></div>'
    const carried = carryEarlyUse(use)
    let filledInSameTask = false
    setTimeout(() => {
      document.querySelector('#app .q-layout')!.innerHTML = '<textarea data-test="moment-body"></textarea>'
      // MutationObserver callbacks run as microtasks, before the next task (a key press) could arrive.
      queueMicrotask(() => queueMicrotask(() => (filledInSameTask = document.querySelector('textarea')!.value !== '')))
    }, 20)
    await carried
    expect(document.querySelector('textarea')!.value).toBe('Said yes again when I meant no')
    expect(filledInSameTask).toBe(true)
  })

  it('leaves the app alone when nothing was done', async () => {
    prerendered()
    const use = readEarlyUse()
    const { field, help } = mountApp()
    let opened = 0
    help.addEventListener('click', () => opened++)
    await carryEarlyUse(use)
    expect(field.value).toBe('')
    expect(document.activeElement).not.toBe(field)
    expect(opened).toBe(0)
  })
})

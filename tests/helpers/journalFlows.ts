import type { Page } from 'playwright-core'

/** Saves a moment from Today the quick way: tap the box, type, tap save. */
export async function saveMoment(page: Page, text: string): Promise<void> {
  await page.getByLabel('What is happening?').click()
  await page.keyboard.type(text)
  await page.locator('[data-test=moment-save]').click()
  await page.getByText('Moment saved, on this device.').first().waitFor()
}

export interface TugScript {
  describe: string
  distressBefore?: boolean
  wantA: string
  wantB: string
  ladderA: string[]
  ladderB: string[]
  meetingPoint?: string
  background?: string
  /** Called after each step is shown, e.g. for screenshots. */
  onStep?: (name: string) => Promise<void>
}

async function next(page: Page) {
  await page.locator('[data-test=tug-next]').click()
}

/** Walks the whole tug flow from Today and saves it; returns on the saved entry's page. */
export async function writeTug(page: Page, s: TugScript): Promise<void> {
  const step = async (name: string) => { await s.onStep?.(name) }
  await page.locator('[data-test=tug-start], [data-test=tug-resume]').first().click()
  await page.locator('[data-test=tug-describe]').fill(s.describe)
  await step('describe')
  await next(page)
  if (s.distressBefore) {
    // The slider answers the keyboard, as a person using one would: from the middle, three steps up.
    await page.locator('[data-test=distress-slider]').focus()
    for (let i = 0; i < 3; i++) await page.keyboard.press('ArrowRight')
  }
  await step('distressBefore')
  await next(page)
  await page.locator('[data-test=want-text]').fill(s.wantA)
  await step('wantA')
  await next(page)
  await page.locator('[data-test=want-text]').fill(s.wantB)
  await next(page)
  for (const rung of s.ladderA) {
    await page.locator('[data-test=rung-input]').fill(rung)
    await page.locator('[data-test=rung-add]').click()
  }
  await step('climbA')
  await next(page)
  for (const rung of s.ladderB) {
    await page.locator('[data-test=rung-input]').fill(rung)
    await page.locator('[data-test=rung-add]').click()
  }
  await next(page)
  if (s.meetingPoint) await page.locator('[data-test=tug-meeting]').fill(s.meetingPoint)
  await step('meetingPoint')
  await next(page)
  if (s.background) await page.locator('[data-test=tug-background]').first().fill(s.background)
  await next(page)
  await next(page)
  await step('review')
  await page.locator('[data-test=tug-save]').click()
  await page.getByText('Tug saved, on this device.').first().waitFor()
}

export const sampleTug: TugScript = {
  describe: 'My manager asked me to stay late again, and I said yes before I could think.',
  distressBefore: true,
  wantA: 'Say no and go home on time',
  wantB: 'Be seen as reliable at work',
  ladderA: ['Rest in the evenings', 'Having energy for my kids', 'Being a present parent'],
  ladderB: ['Keeping this job', 'Security for my family', 'Being a present parent, without money worries'],
  meetingPoint: 'Looking after my family',
  background: 'I was remembering how my father worked every weekend.',
}

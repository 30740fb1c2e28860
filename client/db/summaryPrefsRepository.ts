import { z } from 'zod'
import { readSetting, writeSetting } from './settingsRepository'

const bringUpSchema = z.array(z.string().max(2000)).max(50)

/** "Things I want to bring up", kept on this device between visits to the summary. */
export async function readBringUp(): Promise<string[]> {
  const parsed = bringUpSchema.safeParse(await readSetting('summaryBringUp'))
  return parsed.success ? parsed.data : []
}

export async function writeBringUp(items: string[]): Promise<void> {
  await writeSetting('summaryBringUp', bringUpSchema.parse(items))
}

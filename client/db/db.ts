import { RungsDB } from './RungsDB'

/** The one Dexie instance of the app. */
export const db = new RungsDB()

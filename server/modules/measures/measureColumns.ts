import type { Entry } from '../../../shared/schemas/entry.schema'
import { measureResultOfEntry } from '../../../shared/scoring/measureResults'
import { NO_MEASURE } from '../../db/models/SharedEntry'

/**
 * The score columns stored beside a shared copy (SharedEntry.measure*), computed by the server from the raw answers with
 * shared/scoring, never taken from the device. Other kinds, and forms still in progress, store no score.
 */
export function measureColumnsOf(entry: Entry) {
  const r = measureResultOfEntry(entry)
  if (!r) return { ...NO_MEASURE }
  return { measureInstrument: r.instrument, measureTotal: r.total, measureBand: r.band, measureTakenAt: new Date(r.takenAt) }
}

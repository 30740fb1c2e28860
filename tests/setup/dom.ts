// A real IndexedDB implementation for Dexie under happy-dom.
import 'fake-indexeddb/auto'

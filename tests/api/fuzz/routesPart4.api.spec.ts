import { fuzzPart } from './fuzzSuite'

// Every API route is in exactly one of the four parts (by position in the app's own route list).
await fuzzPart(3, 4)

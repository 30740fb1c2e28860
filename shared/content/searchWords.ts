/**
 * Splits text into the lower-case, accent-free words the journal search indexes and matches by prefix.
 * Used for every entry field and for the query, so both sides agree.
 */
export function searchWords(...texts: (string | undefined)[]): string[] {
  const words = new Set<string>()
  for (const text of texts) {
    if (!text) continue
    const plain = text.normalize('NFKD').replace(/\p{M}+/gu, '').toLowerCase()
    for (const w of plain.split(/[^\p{L}\p{N}]+/u)) if (w.length >= 2) words.add(w.slice(0, 40))
  }
  return [...words]
}

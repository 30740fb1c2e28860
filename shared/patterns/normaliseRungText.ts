/*
 * Words dropped from the start of a rung before rungs are compared (common practice: stop-word stripping). A rung
 * answers "What is that for?", so answers tend to open with purpose words, articles, "I can" and state verbs:
 * "To feel safe", "So I can feel safe", "Feeling safe.", "Being safe" all come down to "safe".
 */
const leadingFiller = new Set(['to', 'so', 'that', 'for', 'a', 'an', 'the', 'i', 'can', 'could', 'will', 'would', 'be', 'being', 'feel', 'feeling'])

// A simple plural fold (common practice): "friends" → "friend", but not "less", "focus", "this" or short words.
function foldPlural(word: string): string {
  return word.length > 3 && word.endsWith('s') && !/(?:ss|us|is)$/.test(word) ? word.slice(0, -1) : word
}

/**
 * The key rungs are grouped by when looking for higher wants that recur. Lower case, accents and apostrophes
 * removed, other punctuation treated as space, leading filler words dropped (the last word is always kept, so
 * "To be" stays "be"), and a simple plural "s" folded on each word. There is no other stemming: "safety" and
 * "safe" stay apart. Returns "" for text with no letters or digits.
 */
export function normaliseRungText(text: string): string {
  const words = text
    .normalize('NFKD')
    .replace(/\p{M}+/gu, '')
    .toLowerCase()
    .replace(/['\u2019]/g, '')
    .split(/[^\p{L}\p{N}]+/u)
    .filter(Boolean)
  let start = 0
  while (start < words.length - 1 && leadingFiller.has(words[start]!)) start++
  return words.slice(start).map(foldPlural).join(' ')
}

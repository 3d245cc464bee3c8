// Folding and matching feature names: users type "Theophilus", "théophilus" or "theophil" for one crater.

// Letters that Unicode does not decompose but a reader treats as two plain ones (or one).
const LIGATURES: Record<string, string> = { æ: 'ae', œ: 'oe', ß: 'ss', ø: 'o', đ: 'd', ł: 'l', þ: 'th', ð: 'd' }

/** Lower case, accents and ligatures undone, anything but letters and digits folded to single spaces. */
export function nameKey(name: string): string {
  return name.normalize('NFKD').replace(/\p{M}/gu, '').toLowerCase()
    .replace(/[æœßøđłþð]/g, letter => LIGATURES[letter]!)
    .replace(/[^\p{L}\p{N}]+/gu, ' ').trim()
}

/** The distinct three-letter pieces of a key, padded so that word starts and ends count. */
export function trigrams(key: string): string[] {
  const out = new Set<string>()
  for (const word of key.split(' ').filter(Boolean)) {
    const padded = `  ${word} `
    for (let i = 0; i + 3 <= padded.length; i += 1) out.add(padded.slice(i, i + 3))
  }
  return [...out]
}

/** Share of trigrams in common (Jaccard), 0..1. */
export function similarity(a: string[], b: string[], shared: number): number {
  const union = a.length + b.length - shared
  return union === 0 ? 0 : shared / union
}

// eslint-disable-next-line no-control-regex
const CONTROL = /[\u0000-\u001F\u007F]/

/** Names are the users' own: 1–80 characters after trimming, no control characters. */
export function nameProblem(name: string): string | null {
  const trimmed = name.trim()
  if (trimmed.length < 1) return 'Give the feature a name.'
  if (trimmed.length > 80) return 'Use at most 80 characters.'
  if (CONTROL.test(trimmed)) return 'Use letters, digits and punctuation only.'
  if (nameKey(trimmed) === '') return 'Use at least one letter or digit.'
  return null
}

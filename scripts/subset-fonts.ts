// Writes the display font the app serves: Crimson Pro (SIL Open Font License 1.1, from @fontsource/crimson-pro)
// cut down to the one weight and the characters the interface sets in it, and the @font-face rules for it.
//   npm run fonts   → assets/fonts/crimson-pro-400-core.woff2, assets/fonts/crimson-pro.css and the licence
//
// Crimson Pro sets headings, the brand and a few figures, all at weight 400 (Tailwind's preflight makes
// headings inherit the body weight, and no display text is bold or italic). The core file holds the
// characters of English text, of names written in Western European languages and the marks the interface
// prints (dashes, curly quotes, ellipsis, the middle dot, degree, prime, minus). A name with a letter outside
// it, in a user's heading, takes that letter from Crimson Pro's latin-ext file, which the browser fetches
// only when such a letter is on the page (unicode-range); anything further falls back to Georgia.
import { copyFileSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs'
import { createRequire } from 'node:module'
import { resolve } from 'node:path'
import subsetFont from 'subset-font'

const ROOT = resolve(import.meta.dirname, '..')
const OUT = resolve(ROOT, 'assets/fonts')
const require = createRequire(import.meta.url)

/** Code point ranges of the core file, [first, last] inclusive. */
const CORE: [number, number][] = [
  [0x20, 0x7E], // Basic Latin
  [0xA0, 0xFF], // Latin-1 Supplement: accented letters of Western European names, ° · × ÷
  [0x152, 0x153], // Œ œ
  [0x2013, 0x2014], // – —
  [0x2018, 0x2019], // ‘ ’
  [0x201C, 0x201D], // “ ”
  [0x2022, 0x2022], // •
  [0x2026, 0x2026], // …
  [0x2032, 0x2033], // ′ ″
  [0x2212, 0x2212], // −
]

const hex = (n: number) => n.toString(16).toUpperCase().padStart(4, '0')
const range = ([a, b]: [number, number]) => (a === b ? `U+${hex(a)}` : `U+${hex(a)}-${hex(b)}`)

async function main() {
  const source = readFileSync(require.resolve('@fontsource/crimson-pro/files/crimson-pro-latin-400-normal.woff2'))
  const text = CORE.flatMap(([a, b]) => Array.from({ length: b - a + 1 }, (_, i) => String.fromCodePoint(a + i))).join('')
  // The latin-ext face keeps the character range fontsource gives it.
  const fontsourceCss = readFileSync(require.resolve('@fontsource/crimson-pro/400.css'), 'utf8')
  const latinExtRange = /crimson-pro-latin-ext-400-normal \*\/[^}]*unicode-range:\s*([^;]+);/.exec(fontsourceCss)?.[1]
  if (!latinExtRange) throw new Error('No latin-ext unicode-range in @fontsource/crimson-pro/400.css')
  const core = await subsetFont(source, text, { targetFormat: 'woff2' })
  mkdirSync(OUT, { recursive: true })
  writeFileSync(resolve(OUT, 'crimson-pro-400-core.woff2'), core)
  const css = `/* Written by scripts/subset-fonts.ts (npm run fonts); edit that, not this. Crimson Pro, SIL Open Font License 1.1. */
@font-face {
  font-family: 'Crimson Pro';
  font-style: normal;
  font-display: swap;
  font-weight: 400;
  src: url(./crimson-pro-400-core.woff2) format('woff2');
  unicode-range: ${CORE.map(range).join(', ')};
}

@font-face {
  font-family: 'Crimson Pro';
  font-style: normal;
  font-display: swap;
  font-weight: 400;
  src: url(@fontsource/crimson-pro/files/crimson-pro-latin-ext-400-normal.woff2) format('woff2');
  unicode-range: ${latinExtRange};
}
`
  writeFileSync(resolve(OUT, 'crimson-pro.css'), css)
  // The cut-down font is a modified version under the same licence, which travels with it.
  copyFileSync(require.resolve('@fontsource/crimson-pro/LICENSE'), resolve(OUT, 'OFL.txt'))
  console.log(`core: ${source.length} → ${core.length} bytes; wrote ${OUT}`)
}

main().catch((error) => {
  console.error(error)
  process.exit(1)
})

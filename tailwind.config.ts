import type { Config } from 'tailwindcss'

// Colours come from CSS variables so the whole interface can switch between the
// default dusk theme and the red night theme without re-rendering anything.
const tone = (name: string) => `rgb(var(--c-${name}) / <alpha-value>)`

export default {
  content: [
    './components/**/*.{vue,ts}',
    './layouts/**/*.vue',
    './pages/**/*.vue',
    './composables/**/*.ts',
    './app.vue',
    './error.vue',
  ],
  theme: {
    extend: {
      colors: {
        'ink': tone('ink'),
        'panel': tone('panel'),
        'raised': tone('raised'),
        'line': tone('line'),
        'text': tone('text'),
        'muted': tone('muted'),
        'accent': tone('accent'),
        'accent-ink': tone('accent-ink'),
        'caution': tone('caution'),
        'danger': tone('danger'),
        'ok': tone('ok'),
        'lit': tone('lit'),
        'shade': tone('shade'),
      },
      fontFamily: {
        display: ['"Crimson Pro"', 'Georgia', 'serif'],
        sans: ['system-ui', '-apple-system', '"Segoe UI"', 'Roboto', '"Noto Sans"', 'sans-serif'],
      },
      minHeight: { touch: '44px' },
      minWidth: { touch: '44px' },
    },
  },
  plugins: [],
} satisfies Config

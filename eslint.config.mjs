import withNuxt from './.nuxt/eslint.config.mjs'

export default withNuxt({
  ignores: ['.output/**', '.data/**', 'tests/e2e/artifacts/**', 'bench/results/**'],
})

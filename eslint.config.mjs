import withNuxt from './.nuxt/eslint.config.mjs'

export default withNuxt(
  {
    ignores: ['.output/**', '.data/**', 'tests/e2e/artifacts/**', 'bench/results/**'],
  },
  {
    // Migrations take Kysely<any> by design: they must not follow later schema types.
    // Tests read JSON answers loosely.
    files: ['db/migrations/**', 'tests/**'],
    rules: { '@typescript-eslint/no-explicit-any': 'off' },
  },
)

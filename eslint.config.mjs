// Lint: the @nuxt/eslint preset (generated into .nuxt by `nuxt prepare`) plus the project's few extra rules.
import withNuxt from './.nuxt/eslint.config.mjs'

export default withNuxt(
  {
    ignores: ['bench/out/**', 'test-results/**', 'data/**', 'uploads/**'],
  },
  {
    // tests read loosely shaped JSON answers and assert on them; `any` there is the point, not an oversight
    files: ['tests/**/*.ts', 'fakes/**/*.test.ts'],
    rules: { '@typescript-eslint/no-explicit-any': 'off' },
  },
  {
    files: ['**/*.ts', '**/*.vue'],
    rules: {
      '@typescript-eslint/consistent-type-imports': ['error', { fixStyle: 'inline-type-imports' }],
    },
  },
)

// Lint: the @nuxt/eslint preset (generated into .nuxt by `nuxt prepare`) plus the project's few extra rules.
import withNuxt from './.nuxt/eslint.config.mjs'

export default withNuxt(
  {
    ignores: ['bench/out/**', 'test-results/**', 'data/**', 'uploads/**'],
  },
  {
    files: ['**/*.ts', '**/*.vue'],
    rules: {
      '@typescript-eslint/consistent-type-imports': ['error', { fixStyle: 'inline-type-imports' }],
    },
  },
)

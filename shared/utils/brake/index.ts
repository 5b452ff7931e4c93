/**
 * Boreline brake calculations: pure TypeScript, SI units inside, no framework imports.
 * Import with `#shared/utils/brake` (Nuxt auto-imports only top-level files of shared/utils).
 */
export * from './units'
export * from './schemas'
export * from './hydraulics'
export * from './circuit'
export * from './comparison'
export * from './bore-check-systems'
export * from './bore-check-findings'
export * from './bore-check'
export * from './fluid'
export * from './wear'
export * from './friction-codes'

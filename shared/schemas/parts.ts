/**
 * The catalogue's input schemas, one file per job under ./catalogue/, gathered here for code that wants them all.
 * Inside the project import the file that does the job.
 */
export * from './catalogue/part-types'
export * from './catalogue/specs'
export * from './catalogue/spec-fields'
export * from './catalogue/params'
export * from './catalogue/vehicle-queries'
export * from './catalogue/list-query'
export * from './catalogue/fitments'
export * from './catalogue/upkeep'
export { FITTING_RULES, sameFitting, type FittingRule } from '../utils/catalogue/fitting-rules'

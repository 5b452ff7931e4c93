/**
 * The one severity scale, used by the inspection's verdicts, the findings a quote copies from it, the quote's lines
 * and the owner's page: the same words for the same judgement everywhere. Stored values stay as they are (a verdict
 * `fail` / `advise` / `ok`; a line's recommendation `required` / `advised`); only these words reach a screen.
 */
export type SeverityLevel = 'fail' | 'advise' | 'ok'
export type LineRecommendation = 'required' | 'advised'

export interface SeverityStep {
  /** The word on a badge. */
  word: string
  /** What it means, for a tooltip, a legend or the owner's page. */
  meaning: string
}

export const SEVERITY_SCALE: Readonly<Record<SeverityLevel, SeverityStep>> = {
  fail: { word: 'Fix now', meaning: 'unsafe, or fails the roadworthiness test: put it right before the vehicle is driven on' },
  advise: { word: 'Fix soon', meaning: 'worn or doubtful: plan it with the next work, or re-check it' },
  ok: { word: 'Sound', meaning: 'within its limits' },
}

/** The level a quote line's recommendation stands for. */
export const LEVEL_OF_RECOMMENDATION: Readonly<Record<LineRecommendation, Exclude<SeverityLevel, 'ok'>>> = {
  required: 'fail',
  advised: 'advise',
}

/** The word for a verdict or a recommendation. */
export function severityWord(level: SeverityLevel | LineRecommendation): string {
  const key = level === 'required' || level === 'advised' ? LEVEL_OF_RECOMMENDATION[level] : level
  return SEVERITY_SCALE[key].word
}

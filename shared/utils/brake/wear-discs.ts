/**
 * Discs and pads, wheel by wheel. A disc under its discard thickness fails; one at it, or within a margin of it when
 * the pads are being renewed, or under its refinish minimum while it needs machining, is advised; thickness
 * variation and runout over their limits are advised (clean the hub, re-check), never a failure on their own.
 * Pads fail under 1.5 mm and are advised at about 3 mm; inner and outer, or left and right, far apart point to a
 * sticking slide or piston.
 */
import type { AxleName } from '../../types/axles'
import type { DiscWear, PadWear, WheelPosition } from './wear-schemas'
import { READING_MARGIN, WEAR_DEFAULTS, axleOf, capitalised, mmText, wheelName, type Verdict, type WearItem } from './wear-items'

/** Rounded to 1e-6 mm so 22.03 − 21.98 reads 0.05, not 0.05000000000000071. */
const tidy = (n: number) => Math.round(n * 1e6) / 1e6

/** What the rest of the inspection tells the disc check: are the pads on this axle due? */
export interface DiscContext { padsDue: boolean }

function thicknessItem(disc: DiscWear, needsMachining: boolean, ctx: DiscContext): WearItem {
  const Where = `${capitalised(wheelName(disc.position))} disc`
  const thinnest = Math.min(...disc.thicknessReadingsMm)
  const discard = disc.minThicknessMm
  const refinish = disc.refinishMinThicknessMm
  const spare = tidy(thinnest - discard)
  let verdict: Verdict = 'ok'
  let message = `${Where}: thinnest reading ${mmText(thinnest)}, ${mmText(spare)} above the discard thickness ${mmText(discard)}.`
  if (thinnest < discard - READING_MARGIN) {
    verdict = 'fail'
    message = `${Where}: thinnest reading ${mmText(thinnest)} is under the discard thickness ${mmText(discard)}: replace the discs as an axle pair; never machine below the minimum.`
  } else if (thinnest <= discard + READING_MARGIN) {
    verdict = 'advise'
    message = `${Where}: thinnest reading ${mmText(thinnest)} is at the discard thickness: nothing is left to wear; replace the discs with the next pads.`
  } else if (ctx.padsDue && spare <= WEAR_DEFAULTS.discMarginWithPadsMm + READING_MARGIN) {
    verdict = 'advise'
    message = `${Where}: thinnest reading ${mmText(thinnest)}, within ${mmText(WEAR_DEFAULTS.discMarginWithPadsMm)} of the discard thickness ${mmText(discard)} while the pads are due: renew the discs with the pads (they would pass the minimum before the new pads wear out).`
  } else if (refinish !== undefined && thinnest < refinish - READING_MARGIN) {
    verdict = needsMachining ? 'advise' : 'ok'
    message = needsMachining
      ? `${Where}: thinnest reading ${mmText(thinnest)} is under the refinish minimum ${mmText(refinish)} and it needs machining: it can't be machined, replace the discs as a pair.`
      : `${Where}: thinnest reading ${mmText(thinnest)}, above the discard thickness ${mmText(discard)} but under the refinish minimum ${mmText(refinish)}: fine to run, but it can't be machined.`
  }
  return {
    id: `disc:${disc.position}:thickness`, kind: 'disc-thickness', subject: 'disc', axle: axleOf(disc.position), position: disc.position,
    verdict, message, measured: thinnest, limit: discard, unit: 'mm', limitSource: 'vehicle data',
  }
}

/** Thickness (discard and refinish), thickness variation and runout for one disc. */
export function checkDisc(disc: DiscWear, ctx: DiscContext = { padsDue: false }): WearItem[] {
  const Where = `${capitalised(wheelName(disc.position))} disc`
  const base = { subject: 'disc' as const, axle: axleOf(disc.position), position: disc.position, unit: 'mm' }
  const thinnest = Math.min(...disc.thicknessReadingsMm)
  const readings = disc.thicknessReadingsMm
  const tv = disc.thicknessVariationMm ?? (readings.length >= 2 ? tidy(Math.max(...readings) - thinnest) : null)
  const tvLimit = disc.thicknessVariationLimitMm ?? WEAR_DEFAULTS.thicknessVariationLimitMm
  const runoutLimit = disc.runoutLimitMm ?? WEAR_DEFAULTS.runoutLimitMm
  const tvOver = tv !== null && tv > tvLimit + READING_MARGIN
  const runoutOver = disc.runoutMm !== undefined && disc.runoutMm > runoutLimit + READING_MARGIN
  const items: WearItem[] = [thicknessItem(disc, tvOver || runoutOver, ctx)]
  const floor = disc.refinishMinThicknessMm ?? disc.minThicknessMm

  if (tv !== null) {
    const spare = tidy(thinnest - floor)
    items.push({
      ...base, id: `disc:${disc.position}:thickness-variation`, kind: 'disc-thickness-variation',
      verdict: tvOver ? 'advise' : 'ok',
      message: tvOver
        ? `${Where}: thickness variation ${mmText(tv)} is over the limit ${mmText(tvLimit)} (pedal pulsation, judder): clean the hub face and re-check; ` +
          (spare > tv + READING_MARGIN
            ? `machine only if the disc stays above ${mmText(floor)} afterwards (${mmText(spare)} to spare), otherwise replace the pair.`
            : 'too little material to machine it out: replace the discs as a pair.')
        : `${Where}: thickness variation ${mmText(tv)}, within the limit ${mmText(tvLimit)}.`,
      measured: tv, limit: tvLimit, limitSource: disc.thicknessVariationLimitMm === undefined ? 'default' : 'vehicle data',
    })
  }
  if (disc.runoutMm !== undefined) {
    items.push({
      ...base, id: `disc:${disc.position}:runout`, kind: 'disc-runout',
      verdict: runoutOver ? 'advise' : 'ok',
      message: runoutOver
        ? `${Where}: lateral runout ${mmText(disc.runoutMm)} is over the limit ${mmText(runoutLimit)}: clean the hub face, refit or re-index the disc and measure again; if it stays over, machine on the car or replace.`
        : `${Where}: lateral runout ${mmText(disc.runoutMm)}, within the limit ${mmText(runoutLimit)}.`,
      measured: disc.runoutMm, limit: runoutLimit, limitSource: disc.runoutLimitMm === undefined ? 'default' : 'vehicle data',
    })
  }
  return items
}

function padWhere(pads: PadWear): { id: string; position: WheelPosition | null; label: string } {
  if (!pads.side) return { id: pads.axle, position: null, label: `${capitalised(pads.axle)}` }
  const position = `${pads.axle}-${pads.side}` as WheelPosition
  return { id: `${pads.axle}:${pads.side}`, position, label: capitalised(wheelName(position)) }
}

/** Friction material left on the inner and outer pad of one wheel (or one axle), and whether they wear evenly. */
export function checkPads(pads: PadWear): WearItem[] {
  const where = padWhere(pads)
  const base = { kind: 'pad-thickness' as const, subject: 'pads' as const, axle: pads.axle, position: where.position, unit: 'mm', limitSource: 'default' as const }
  const items: WearItem[] = (['inner', 'outer'] as const).map((face) => {
    const value = face === 'inner' ? pads.innerMm : pads.outerMm
    const fail = value < WEAR_DEFAULTS.padFailBelowMm - READING_MARGIN
    const advise = !fail && value <= WEAR_DEFAULTS.padAdviseMm + READING_MARGIN
    return {
      ...base, id: `pad:${where.id}:${face}`,
      verdict: fail ? 'fail' : advise ? 'advise' : 'ok',
      message: fail
        ? `${where.label} ${face} pad: ${mmText(value)} of friction material, under ${mmText(WEAR_DEFAULTS.padFailBelowMm)}: replace the pads on both sides of the axle now.`
        : advise
          ? `${where.label} ${face} pad: ${mmText(value)} of friction material, about ${mmText(WEAR_DEFAULTS.padAdviseMm)} or less: renew the axle's pads soon.`
          : `${where.label} ${face} pad: ${mmText(value)} of friction material.`,
      measured: value, limit: fail ? WEAR_DEFAULTS.padFailBelowMm : WEAR_DEFAULTS.padAdviseMm,
    }
  })
  const apart = tidy(Math.abs(pads.innerMm - pads.outerMm))
  if (apart > WEAR_DEFAULTS.unevenPadWearMm + READING_MARGIN) {
    const worn = pads.innerMm < pads.outerMm ? 'inner' : 'outer'
    items.push({
      ...base, kind: 'pad-wear-uneven', id: `pad:${where.id}:uneven`, verdict: 'advise', measured: apart, limit: WEAR_DEFAULTS.unevenPadWearMm,
      message: `${where.label} pads wear unevenly: inner ${mmText(pads.innerMm)}, outer ${mmText(pads.outerMm)} (${mmText(apart)} apart, the ${worn} pad thinner): check the caliper ${worn === 'inner' ? 'piston' : 'slides'} for sticking before fitting new pads.`,
    })
  }
  return items
}

/** Left against right on each axle: a wheel whose pads wear much faster has a dragging caliper. */
export function checkPadSides(pads: readonly PadWear[]): WearItem[] {
  const items: WearItem[] = []
  for (const axle of ['front', 'rear'] as AxleName[]) {
    const left = pads.find((p) => p.axle === axle && p.side === 'left')
    const right = pads.find((p) => p.axle === axle && p.side === 'right')
    if (!left || !right) continue
    const l = Math.min(left.innerMm, left.outerMm)
    const r = Math.min(right.innerMm, right.outerMm)
    const apart = tidy(Math.abs(l - r))
    if (apart <= WEAR_DEFAULTS.unevenPadWearMm + READING_MARGIN) continue
    const worn: WheelPosition = l < r ? `${axle}-left` : `${axle}-right`
    items.push({
      id: `pad:${axle}:sides`, kind: 'pad-wear-sides', subject: 'pads', axle, position: worn, verdict: 'advise', measured: apart,
      limit: WEAR_DEFAULTS.unevenPadWearMm, unit: 'mm', limitSource: 'default',
      message: `${capitalised(axle)} pads wear unevenly side to side: ${axle} left ${mmText(l)}, ${axle} right ${mmText(r)}: check the ${wheelName(worn)} caliper piston, slides and hose for dragging.`,
    })
  }
  return items
}

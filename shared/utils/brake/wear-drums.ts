/**
 * Drums and shoe linings, wheel by wheel. A drum over its maximum diameter fails; one at its maximum, or within the
 * machining allowance under it, is advised: it can't be machined, so it is replaced if it needs machining. A drum
 * exactly at its maximum is not "worn past" it.
 */
import type { DrumWear, ShoeWear } from './wear-schemas'
import { READING_MARGIN, WEAR_DEFAULTS, axleOf, capitalised, mmText, wheelName, type WearItem } from './wear-items'

/** Drum inside diameter against its maximum (discard) diameter and the machining allowance under it. */
export function checkDrum(drum: DrumWear): WearItem {
  const Where = `${capitalised(wheelName(drum.position))} drum`
  const max = drum.maxDiameterMm
  const allowance = drum.machiningAllowanceMm ?? WEAR_DEFAULTS.drumMachiningAllowanceMm
  const over = drum.diameterMm > max + READING_MARGIN
  const atMax = !over && drum.diameterMm >= max - READING_MARGIN
  const close = !over && !atMax && drum.diameterMm > max - allowance + READING_MARGIN
  return {
    id: `drum:${drum.position}:diameter`, kind: 'drum-diameter', subject: 'drum', axle: axleOf(drum.position), position: drum.position,
    verdict: over ? 'fail' : atMax || close ? 'advise' : 'ok',
    message: over
      ? `${Where}: ${mmText(drum.diameterMm)} is over its maximum diameter ${mmText(max)}: replace the drums as an axle pair; never machine beyond the maximum.`
      : atMax
        ? `${Where}: ${mmText(drum.diameterMm)} is at its maximum diameter: no metal is left to machine; replace the pair if it needs machining.`
        : close
          ? `${Where}: ${mmText(drum.diameterMm)}, within the ${mmText(allowance)} machining allowance under its maximum ${mmText(max)}: it can't be machined; replace the pair if it needs machining.`
          : `${Where}: ${mmText(drum.diameterMm)}, ${mmText(Math.round((max - drum.diameterMm) * 1e6) / 1e6)} under its maximum ${mmText(max)}.`,
    measured: drum.diameterMm, limit: max, unit: 'mm', limitSource: 'vehicle data',
  }
}

/** Lining left on a wheel's shoes. */
export function checkShoes(shoes: ShoeWear): WearItem {
  const Where = `${capitalised(wheelName(shoes.position))} shoes`
  const v = shoes.liningMm
  const fail = v < WEAR_DEFAULTS.shoeFailBelowMm - READING_MARGIN
  const advise = !fail && v <= WEAR_DEFAULTS.shoeAdviseMm + READING_MARGIN
  return {
    id: `shoes:${shoes.position}:lining`, kind: 'shoe-lining', subject: 'shoes', axle: axleOf(shoes.position), position: shoes.position,
    verdict: fail ? 'fail' : advise ? 'advise' : 'ok',
    message: fail
      ? `${Where}: ${mmText(v)} of lining, under ${mmText(WEAR_DEFAULTS.shoeFailBelowMm)}: replace the axle's shoes now.`
      : advise
        ? `${Where}: ${mmText(v)} of lining, ${mmText(WEAR_DEFAULTS.shoeAdviseMm)} or less: renew the axle's shoes soon.`
        : `${Where}: ${mmText(v)} of lining.`,
    measured: v, limit: fail ? WEAR_DEFAULTS.shoeFailBelowMm : WEAR_DEFAULTS.shoeAdviseMm, unit: 'mm', limitSource: 'default',
  }
}

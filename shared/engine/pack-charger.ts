/**
 * Which chargers a pack may live on. A luminaire's charger is made for one chemistry family: nickel
 * chargers push a constant current and leave it on, lithium chargers stop at a voltage limit, lead-acid
 * chargers float at a voltage. The rules and their sources: docs/method.md, "Charger fit".
 */
import { z } from 'zod'
import type { Chemistry, ChemistryId } from './chemistries/types'
import { roundToSignificant as round } from './round'

export const CHARGER_TYPES = ['nickel-constant-current', 'lithium-cc-cv', 'lead-acid-float', 'unknown'] as const
export type ChargerType = (typeof CHARGER_TYPES)[number]
export const chargerTypeSchema = z.enum(CHARGER_TYPES, { errorMap: () => ({ message: `must be one of ${CHARGER_TYPES.join(', ')}` }) })

export type ChargerVerdict = 'yes' | 'conditional' | 'no'

/** The charger type a luminaire was most likely built with, from the chemistry of the pack it came with. */
export function chargerTypeForFamily(family: Chemistry['family']): Exclude<ChargerType, 'unknown'> {
  return family === 'nickel' ? 'nickel-constant-current' : family === 'lithium' ? 'lithium-cc-cv' : 'lead-acid-float'
}

export interface ChargerFitInput {
  chemistry: Chemistry
  cellsInSeries: number
  capacityAh: number
  /** A known type (resolve "unknown" before calling). */
  chargerType: Exclude<ChargerType, 'unknown'>
  chargeCurrentA: number
  trickleCurrentA: number
  /** The pack the charger was made for, when known (the old pack): a lithium or lead charger fits that chemistry and cell count. */
  madeFor?: { chemistry: ChemistryId; cellsInSeries: number }
}

export interface ChargerFit {
  verdict: ChargerVerdict
  chargeCRate: number
  trickleCRate: number
  /** Why the verdict is not a plain yes (or what makes it yes), in plain words. */
  reasons: string[]
}

const fmtC = (c: number) => (c > 0 ? `C/${round(1 / c, 2)}` : '0')
const worse = (a: ChargerVerdict, b: ChargerVerdict): ChargerVerdict =>
  a === 'no' || b === 'no' ? 'no' : a === 'conditional' || b === 'conditional' ? 'conditional' : 'yes'

/** Whether a pack may be charged by a charger of a given type and current. */
export function chargerFit(input: ChargerFitInput): ChargerFit {
  const { chemistry, chargerType } = input
  const chargeCRate = input.chargeCurrentA / input.capacityAh
  const trickleCRate = input.trickleCurrentA / input.capacityAh
  const reasons: string[] = []
  let verdict: ChargerVerdict = 'yes'
  const family = chemistry.family
  const madeForThis = input.madeFor?.chemistry === chemistry.id && input.madeFor.cellsInSeries === input.cellsInSeries

  if (chargerType === 'nickel-constant-current') {
    if (family === 'lithium') {
      return {
        verdict: 'no',
        chargeCRate,
        trickleCRate,
        reasons: [
          `Never on a nickel charger: its constant current has no voltage limit and never stops, so ${chemistry.name} cells would be overcharged (fire risk).`,
        ],
      }
    }
    if (family === 'lead') {
      return {
        verdict: 'no',
        chargeCRate,
        trickleCRate,
        reasons: ['A lead-acid block needs a float charger held at a set voltage; a constant current left on overcharges it, dries it out and makes it vent.'],
      }
    }
    const limit = chemistry.continuousChargeRangeC.value
    if (trickleCRate > limit.max * (1 + 1e-9)) {
      if (chemistry.id === 'nimh') {
        verdict = 'no'
        reasons.push(
          `NiMH only on a nickel charger whose permanent current stays within its limit: ${fmtC(trickleCRate)} is above about ${fmtC(limit.max)} and heats and ages NiMH.`,
        )
      } else {
        verdict = worse(verdict, 'conditional')
        reasons.push(
          `The permanent charge of ${fmtC(trickleCRate)} is above the ${fmtC(limit.max)} ${chemistry.name} tolerates: it works but shortens the life; high-temperature cells take up to 0.1 C.`,
        )
      }
    } else if (trickleCRate < limit.min * (1 - 1e-9)) {
      verdict = worse(verdict, 'conditional')
      reasons.push(
        `The permanent charge of ${fmtC(trickleCRate)} is below about ${fmtC(limit.min)}: it may not make up for self-discharge, so the pack may not stay full.`,
      )
    } else {
      reasons.push(`Permanent charge ${fmtC(trickleCRate)} is within the ${fmtC(limit.min)}–${fmtC(limit.max)} ${chemistry.name} takes.`)
    }
    if (chargeCRate > chemistry.maxChargeRateC.value * (1 + 1e-9)) {
      verdict = worse(verdict, 'conditional')
      reasons.push(`Charge current ${fmtC(chargeCRate)} is above the ${chemistry.maxChargeRateC.value} C a nickel pack takes without end-of-charge control.`)
    }
    return { verdict, chargeCRate, trickleCRate, reasons }
  }

  if (chargerType === 'lithium-cc-cv') {
    if (family !== 'lithium') {
      return {
        verdict: 'no',
        chargeCRate,
        trickleCRate,
        reasons: [
          family === 'nickel'
            ? 'A lithium charger ends the charge at a voltage that nickel cells do not reach reliably: the pack is left part-charged or overcharged.'
            : 'A lithium charger does not hold the float voltage a lead-acid block needs.',
        ],
      }
    }
    if (input.madeFor && madeForThis)
      return { verdict: 'yes', chargeCRate, trickleCRate, reasons: ['Same chemistry and cell count as the pack the charger was made for.'] }
    if (input.madeFor && input.madeFor.chemistry !== chemistry.id) {
      return {
        verdict: 'no',
        chargeCRate,
        trickleCRate,
        reasons: [
          `The charger stops at the voltage of the pack it was made for; ${chemistry.name} needs ${chemistry.fullChargeCellVoltage.value} V per cell, so it would be overcharged or left part-charged.`,
        ],
      }
    }
    return {
      verdict: 'conditional',
      chargeCRate,
      trickleCRate,
      reasons: [
        `Only if the charger stops at ${round(input.cellsInSeries * chemistry.fullChargeCellVoltage.value)} V (${input.cellsInSeries} × ${chemistry.fullChargeCellVoltage.value} V) and does not charge below 0 °C: check its marking.`,
      ],
    }
  }

  // Lead-acid float charger.
  if (family !== 'lead') {
    return {
      verdict: 'no',
      chargeCRate,
      trickleCRate,
      reasons: [
        family === 'nickel'
          ? 'Nickel cells must not be held at a constant voltage: their voltage falls as they warm on charge, the current rises, and they can run away thermally.'
          : `A float charger holds its voltage for ever; ${chemistry.name} must stop when full and needs its own end voltage.`,
      ],
    }
  }
  if (input.madeFor && madeForThis) return { verdict: 'yes', chargeCRate, trickleCRate, reasons: ['Same block as the one the float charger was set for.'] }
  return {
    verdict: 'conditional',
    chargeCRate,
    trickleCRate,
    reasons: [
      `Only if the float voltage is set for ${input.cellsInSeries} cells (about ${round(input.cellsInSeries * (chemistry.float?.cellVoltageAt25C.value ?? chemistry.fullChargeCellVoltage.value), 3)} V at 25 °C).`,
    ],
  }
}

/**
 * Input pieces the battery tools share (size, charge, compare): the load, the driver, the
 * chemistry id, hours fields. One schema per concept, reused so the three tools read alike.
 */
import { z } from 'zod'
import { CHEMISTRY_IDS } from './chemistries'
import { finiteNumber, fraction, quantity } from './fields'
import { parseQuantity } from './quantity'

export const chemistryIdSchema = z.enum(CHEMISTRY_IDS, {
  errorMap: () => ({ message: `must be one of ${CHEMISTRY_IDS.join(', ')}` }),
})

/** 'direct': the pack feeds the LED string through a current limiter, so battery current = LED current. 'converter': the pack feeds a DC-DC driver. */
export const driverSchema = z.enum(['direct', 'converter'], {
  errorMap: () => ({ message: 'must be "direct" or "converter"' }),
})
export type Driver = z.infer<typeof driverSchema>

/**
 * The emergency-mode load. Give `power` (at the LEDs), or `ledVoltage` with `ledCurrent`.
 * `mainsPower` is the load in mains mode (maintained luminaires); it does not come from the pack.
 */
export const loadSchema = z.object(
  {
    power: quantity('power', { positive: true, max: 10_000 }).optional(),
    ledVoltage: quantity('voltage', { positive: true, max: 1_000 }).optional(),
    ledCurrent: quantity('current', { positive: true, max: 1_000 }).optional(),
    mainsPower: quantity('power', { positive: true, max: 10_000 }).optional(),
  },
  { errorMap: () => ({ message: 'must be an object with power, or ledVoltage and ledCurrent' }) },
)
export type Load = z.infer<typeof loadSchema>

/** The DC input window of a converter driver, volts (pack voltage). */
export const converterInputSchema = z.object({
  min: quantity('voltage', { positive: true, max: 1_000 }).optional(),
  max: quantity('voltage', { positive: true, max: 1_000 }).optional(),
})
export type ConverterInput = z.infer<typeof converterInputSchema>

const BARE_NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)(e[+-]?\d+)?$/i

/** A number of hours (a bare number is hours, as in "C20"), or a time string such as "20 h". */
export function hours(opts: { max?: number } = {}) {
  const max = opts.max ?? 1_000
  return z
    .union([z.number(), z.string()], { errorMap: () => ({ message: 'must be a number of hours, or a time such as "20 h"' }) })
    .transform((raw, ctx): number => {
      let h: number
      if (typeof raw === 'number') h = raw
      else if (BARE_NUMBER.test(raw.trim())) h = Number(raw.trim())
      else {
        const parsed = parseQuantity(raw, 'time')
        if (!parsed.ok) {
          ctx.addIssue({ code: z.ZodIssueCode.custom, message: parsed.reason })
          return z.NEVER
        }
        h = parsed.value / 3600
      }
      if (!Number.isFinite(h)) {
        ctx.addIssue({ code: z.ZodIssueCode.custom, message: 'must be a finite number' })
        return z.NEVER
      }
      if (!(h > 0)) {
        ctx.addIssue({ code: z.ZodIssueCode.custom, message: 'must be greater than zero' })
        return z.NEVER
      }
      if (h > max) {
        ctx.addIssue({ code: z.ZodIssueCode.custom, message: `must be at most ${max} h` })
        return z.NEVER
      }
      return h
    })
}

/** Fields every battery tool takes for the load and how it is driven. */
export const loadFields = {
  load: loadSchema,
  driver: driverSchema.default('converter'),
  /** Converter efficiency, battery to LEDs; ignored for direct drive. */
  driverEfficiency: fraction().default(0.85),
  converterInput: converterInputSchema.optional(),
  /** Rated duration (a bare number is seconds). */
  duration: quantity('time', { positive: true, max: 100 * 3600, display: { unit: 'h', factor: 1 / 3600 } }),
}

export const designFields = {
  endOfLifeCapacity: fraction().default(0.8),
  depthOfDischarge: fraction().optional(),
  designMargin: finiteNumber({ min: 0, max: 1 }).default(0.1),
  designLifeYears: finiteNumber({ positive: true, max: 50 }).default(4),
}

type Issue = { path: (string | number)[]; message: string }

/** Cross-field checks on the load and driver; returns issues with their field paths. */
export function loadIssues(v: { load?: Load; driver?: Driver; converterInput?: ConverterInput; cellsInSeries?: number }): Issue[] {
  const issues: Issue[] = []
  const load = v.load
  if (!load || typeof load !== 'object') return issues
  const hasPower = typeof load.power === 'number'
  const hasV = typeof load.ledVoltage === 'number'
  const hasI = typeof load.ledCurrent === 'number'
  if (v.driver === 'direct') {
    if (!hasI) issues.push({ path: ['load', 'ledCurrent'], message: 'is required for a direct-driven load (the battery current is the LED current)' })
    if (!hasV && v.cellsInSeries === undefined) {
      issues.push({ path: ['load', 'ledVoltage'], message: 'is required for a direct-driven load unless cellsInSeries is given' })
    }
  } else if (!hasPower && !(hasV && hasI)) {
    if (hasV) issues.push({ path: ['load', 'ledCurrent'], message: 'is required with load.ledVoltage (or give load.power)' })
    else if (hasI) issues.push({ path: ['load', 'ledVoltage'], message: 'is required with load.ledCurrent (or give load.power)' })
    else issues.push({ path: ['load', 'power'], message: 'is required: give load.power, or load.ledVoltage with load.ledCurrent' })
  }
  const w = v.converterInput
  if (w && typeof w.min === 'number' && typeof w.max === 'number' && w.min >= w.max) {
    issues.push({ path: ['converterInput', 'min'], message: 'must be below converterInput.max' })
  }
  return issues
}

/** Power the LEDs take in emergency mode, W. */
export function ledPowerW(load: Load): number {
  if (load.power !== undefined) return load.power
  return (load.ledVoltage ?? 0) * (load.ledCurrent ?? 0)
}

export interface BatteryDraw {
  /** Average current from the pack, A. */
  currentA: number
  /** Average power from the pack, W. */
  powerW: number
  /** Power at the LEDs, W. */
  loadPowerW: number
}

/**
 * What the pack delivers. Direct: I = I_LED, P = V_pack·I_LED. Converter: P = P_LED/η, I = P/V_pack.
 */
export function batteryDraw(load: Load, driver: Driver, efficiency: number, packAverageVoltage: number): BatteryDraw {
  const loadPowerW = driver === 'direct' && load.ledCurrent !== undefined && load.ledVoltage !== undefined ? load.ledVoltage * load.ledCurrent : ledPowerW(load)
  if (driver === 'direct') {
    const currentA = load.ledCurrent as number
    return { currentA, powerW: currentA * packAverageVoltage, loadPowerW }
  }
  const powerW = loadPowerW / efficiency
  return { currentA: powerW / packAverageVoltage, powerW, loadPowerW }
}

/** The wattage audit's input: one zod schema, shared by the API, the CLI and the claim-check form. */
import { z } from 'zod'
import { finiteNumber, quantity } from './fields'

// ---------------------------------------------------------------------------------------------
// Input
// ---------------------------------------------------------------------------------------------

const powerFactorField = () =>
  finiteNumber()
    .refine((v) => v > 0, 'power factor must be greater than 0')
    .refine((v) => v <= 1, 'power factor cannot be greater than 1')

/** Readings that only make sense together. */
const PAIRS: Array<[string, string]> = [
  ['ledVoltageMains', 'ledCurrentMains'],
  ['ledVoltageBattery', 'ledCurrentBattery'],
  ['batteryVoltage', 'batteryChargeCurrent'],
]

export const auditInput = z
  .object({
    /** The power the maker declares, W. */
    claimedPower: quantity('power', { positive: true }),
    /** The apparent power the maker declares, if any, VA. */
    claimedApparentPower: quantity('apparentPower', { positive: true }).optional(),
    supplyVoltage: quantity('voltage', { positive: true }),
    supplyFrequency: quantity('frequency', { positive: true }).optional(),
    /** Real power from a power meter, W. */
    measuredPower: quantity('power', { positive: true }).optional(),
    /** rms current on the mains side, A. */
    measuredCurrent: quantity('current', { positive: true }).optional(),
    /** Power factor shown by the meter, if it shows one. */
    powerFactor: powerFactorField().optional(),
    /** Apparent power shown by the meter, if it shows one, VA. */
    apparentPower: quantity('apparentPower', { positive: true }).optional(),
    /** The meter's lowest reliable current and power; readings below are flagged. */
    meterMinCurrent: quantity('current', { min: 0 }).optional(),
    meterMinPower: quantity('power', { min: 0 }).optional(),
    /** d.c. voltage and current at the LEDs, lit from mains. */
    ledVoltageMains: quantity('voltage', { min: 0 }).optional(),
    ledCurrentMains: quantity('current', { min: 0 }).optional(),
    /** d.c. voltage and current at the LEDs, lit from the battery. */
    ledVoltageBattery: quantity('voltage', { min: 0 }).optional(),
    ledCurrentBattery: quantity('current', { min: 0 }).optional(),
    /** Battery voltage and charging current, on mains with the light off. */
    batteryVoltage: quantity('voltage', { min: 0 }).optional(),
    batteryChargeCurrent: quantity('current', { min: 0 }).optional(),
    mode: z.enum(['maintained', 'non-maintained'], {
      errorMap: () => ({ message: 'must be "maintained" or "non-maintained"' }),
    }),
    hoursPerDay: finiteNumber({ min: 0, max: 24 }),
    tariffPerKWh: finiteNumber({ min: 0 }),
    currency: z.string().trim().min(1, 'must not be empty').max(8, 'must be a short code such as "EUR"').optional(),
    /** How far (±%) the measured power may be from the claim and still count as agreeing. */
    claimTolerancePct: finiteNumber({ min: 0, max: 100 }).default(10),
  })
  .superRefine((input, ctx) => {
    const hasP = input.measuredPower !== undefined
    const hasS = input.measuredCurrent !== undefined || input.apparentPower !== undefined
    const hasPf = input.powerFactor !== undefined
    if (!hasP && !(hasS && hasPf)) {
      ctx.addIssue({
        code: z.ZodIssueCode.custom,
        path: ['measuredPower'],
        message: 'give the measured power, or the current (or apparent power) together with the power factor',
      })
    } else if (hasP && !hasS && !hasPf) {
      ctx.addIssue({
        code: z.ZodIssueCode.custom,
        path: ['measuredCurrent'],
        message: 'give the measured current (or the apparent power or power factor) so the power factor can be found',
      })
    }
    const record = input as Record<string, unknown>
    for (const [a, b] of PAIRS) {
      const hasA = record[a] !== undefined
      const hasB = record[b] !== undefined
      if (hasA !== hasB) {
        ctx.addIssue({
          code: z.ZodIssueCode.custom,
          path: [hasA ? b : a],
          message: `needed together with ${hasA ? a : b}`,
        })
      }
    }
  })

export type AuditInput = z.output<typeof auditInput>

/**
 * Demo wattage audits: two samples of an invented round bulkhead sold as "4 W". On the bench it takes
 * about 2.6 W real but 5.9 VA apparent, and lit from its battery it feeds its LEDs a fifth of the
 * mains power. All readings invented. Idempotent: an audit with the same title is left alone.
 */
import type { EntityManager } from 'typeorm'
import { ENGINE_VERSION } from '../../shared/engine/version'
import { AuditReadingsSchema } from '../../shared/schemas/wattage-audit.schema'
import { evaluate } from '../modules/audits/audits.service'
import { WattageAudit } from '../modules/audits/wattage-audit.entity'
import type { DemoContext } from './accounts.demo'

const BULKHEAD = 'Round LED bulkhead "Quillbrook RB-4" (invented model), sold as 4 W maintained, 3 h, 3.6 V NiCd pack'

const COMMON = {
  claimedPower: '4 W',
  supplyVoltage: '230 V',
  supplyFrequency: '50 Hz',
  mode: 'maintained',
  hoursPerDay: 24,
  tariffPerKWh: 0.28,
  currency: 'EUR',
  meterMinCurrent: '5 mA',
}

export const DEMO_AUDITS: Array<{ title: string; inputs: Record<string, unknown> }> = [
  {
    title: 'Quillbrook RB-4, sample 1 (plant room corridor)',
    inputs: {
      ...COMMON,
      measuredPower: '2.6 W',
      measuredCurrent: '25.7 mA',
      ledVoltageMains: '28.4 V',
      ledCurrentMains: '75 mA',
      ledVoltageBattery: '27.1 V',
      ledCurrentBattery: '16 mA',
      batteryVoltage: '4.1 V',
      batteryChargeCurrent: '60 mA',
    },
  },
  {
    title: 'Quillbrook RB-4, sample 2 (same batch)',
    inputs: {
      ...COMMON,
      measuredPower: '2.7 W',
      measuredCurrent: '26.4 mA',
      ledVoltageMains: '28.6 V',
      ledCurrentMains: '77 mA',
      ledVoltageBattery: '27.0 V',
      ledCurrentBattery: '15 mA',
      batteryVoltage: '4.1 V',
      batteryChargeCurrent: '62 mA',
    },
  },
]

export async function seedAudits(m: EntityManager, ctx: DemoContext): Promise<void> {
  const repo = m.getRepository(WattageAudit)
  for (const demo of DEMO_AUDITS) {
    if (await repo.findOne({ where: { workspaceId: ctx.workspaceId, title: demo.title } })) continue
    const inputs = AuditReadingsSchema.parse(demo.inputs)
    const { results, claimedPowerW } = evaluate(inputs)
    await repo.save(
      repo.create({
        workspaceId: ctx.workspaceId,
        title: demo.title,
        luminaire: BULKHEAD,
        inputs,
        results: results as unknown as Record<string, unknown>,
        claimedPowerW,
        engineVersion: ENGINE_VERSION,
        authorId: ctx.users.technician ?? null,
        specSheetId: null,
        luminaireId: null,
      }),
    )
  }
}

/** Builders for wattage-audit rows in tests (through the service, as a technician would save them). */
import * as audits from '../../server/modules/audits/audits.service'
import { AuditCreateSchema } from '../../shared/schemas/wattage-audit.schema'
import type { TestTeam } from './test-app'

/** Invented bench readings of a maintained LED bulkhead sold as "4 W". */
export const AUDIT_READINGS = {
  claimedPower: '4 W',
  supplyVoltage: '230 V',
  supplyFrequency: '50 Hz',
  measuredPower: '2.6 W',
  measuredCurrent: '25.7 mA',
  ledVoltageMains: '28.4 V',
  ledCurrentMains: '75 mA',
  ledVoltageBattery: '27.1 V',
  ledCurrentBattery: '16 mA',
  batteryVoltage: '3.9 V',
  batteryChargeCurrent: '80 mA',
  mode: 'maintained',
  hoursPerDay: 24,
  tariffPerKWh: 0.3,
  currency: 'EUR',
}

export function auditBody(overrides: Record<string, unknown> = {}) {
  return { title: 'Bulkhead on trial, stair B', luminaire: 'Invented "4 W" LED bulkhead, maintained', inputs: AUDIT_READINGS, ...overrides }
}

/** A saved audit in the team's workspace, recorded by its technician. */
export async function auditIn(team: TestTeam, overrides: Record<string, unknown> = {}) {
  return audits.createAudit(team.workspaceId, team.users.technician.id, AuditCreateSchema.parse(auditBody(overrides)))
}

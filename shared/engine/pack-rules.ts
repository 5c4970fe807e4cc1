/**
 * Rules every pack tool shares (size, charge, replace): cross-field checks on a pack description, and
 * the restrictions, disposal and competent-person notes every pack result carries.
 */
import { CHEMISTRIES } from './chemistries'
import type { Chemistry, ChemistryId } from './chemistries/types'
import { SEVERITY_ORDER, type EngineWarning } from './types'

type Issue = { path: (string | number)[]; message: string }

/** Cross-field checks shared with the charge tool: temperatures in order, cell voltages consistent. */
export function packIssues(v: {
  chemistry?: ChemistryId
  averageCellVoltage?: number
  cutoffCellVoltage?: number
  ambientMin?: number
  ambientMax?: number
}): Issue[] {
  const issues: Issue[] = []
  if (typeof v.ambientMin === 'number' && typeof v.ambientMax === 'number' && v.ambientMin > v.ambientMax) {
    issues.push({ path: ['ambientMin'], message: 'must not be above ambientMax' })
  }
  const chemistry = v.chemistry ? CHEMISTRIES[v.chemistry] : undefined
  if (!chemistry) return issues
  const nominal = chemistry.nominalCellVoltage.value
  if (typeof v.cutoffCellVoltage === 'number' && v.cutoffCellVoltage >= nominal) {
    issues.push({ path: ['cutoffCellVoltage'], message: `must be below the nominal cell voltage (${nominal} V for ${chemistry.name})` })
  }
  if (typeof v.averageCellVoltage === 'number') {
    const cutoff = typeof v.cutoffCellVoltage === 'number' ? v.cutoffCellVoltage : chemistry.cutoffCellVoltage.value
    const full = chemistry.fullChargeCellVoltage.value
    if (v.averageCellVoltage <= cutoff) {
      issues.push({ path: ['averageCellVoltage'], message: `must be above the end-of-discharge voltage (${cutoff} V per cell)` })
    } else if (v.averageCellVoltage > full) {
      issues.push({ path: ['averageCellVoltage'], message: `must not exceed the full-charge voltage (${full} V per cell for ${chemistry.name})` })
    }
  }
  return issues
}

/** True when the warnings are already critical → warning → info (the usual case; saves a sort). */
export function inSeverityOrder(warnings: EngineWarning[]): boolean {
  for (let i = 1; i < warnings.length; i++) if (SEVERITY_ORDER[warnings[i - 1].severity] > SEVERITY_ORDER[warnings[i].severity]) return false
  return true
}

/** Restrictions, disposal and the competent-person note every pack result carries. */
export function addChemistryNotes(chemistry: Chemistry, warnings: EngineWarning[]): void {
  if (chemistry.id === 'nicd' || chemistry.id === 'nicd-ht') {
    warnings.push({
      code: 'cadmium-restricted',
      severity: 'warning',
      field: 'chemistry',
      message:
        'Cadmium: EU Regulation 2023/1542 limits portable batteries to 0.002 % Cd and no longer exempts emergency lighting; whether this pack is portable or industrial is unsettled, so check the classification before specifying NiCd. Recycle, never bin.',
    })
  } else if (chemistry.family === 'lithium') {
    warnings.push({
      code: 'lithium-safety',
      severity: 'info',
      field: 'chemistry',
      message:
        'Lithium: transport needs UN 38.3 evidence; cells can overheat and burn if abused or charged below 0 °C; look for IEC 62133-2 or IEC 62619 and a protection board.',
    })
  } else if (chemistry.family === 'lead') {
    warnings.push({
      code: 'lead-acid-handling',
      severity: 'info',
      field: 'chemistry',
      message: 'Lead-acid: contains lead and sulphuric acid; keep it charged in store and return it for recycling.',
    })
  }
  warnings.push({
    code: 'competent-person',
    severity: 'info',
    message:
      'Engineering estimate only: isolate the mains before work on a luminaire; local codes, the standards in force and a competent, licensed person decide.',
  })
}

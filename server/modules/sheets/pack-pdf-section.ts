/**
 * The "Pack to order" and "Charger check" sections of a specification sheet's PDF: what the pack is
 * ordered by (chemistry, cells, nominal voltage, capacity, cell format) and, when the sheet carries
 * the luminaire's charger, the charger checked against that pack.
 */
import type { EngineWarning } from '../../../shared/engine/types'
import {
  CHARGER_FIT_LABELS,
  CHARGER_TYPE_LABELS,
  CHEMISTRY_LABELS,
  DRIVER_LABELS,
  labelOf,
  MODE_LABELS,
  SEVERITY_LABELS,
  VOLTAGE_BASIS_LABELS,
} from '../../../shared/labels'
import { formatFigure } from '../../../shared/schemas/sheet-text'
import { ensureSpace, heading, pair, write } from '../../lib/pdf/pdf-kit'
import type { PdfSection } from './sheet-pdf-data'

/** Words for an input whose value is a code (mode, charger type…); other inputs are shown as typed. */
export function inputValueText(path: string, value: string): string {
  const maps: Record<string, Record<string, string>> = {
    chemistry: CHEMISTRY_LABELS,
    driver: DRIVER_LABELS,
    mode: MODE_LABELS,
    'charger.type': CHARGER_TYPE_LABELS,
    'charger.voltageBasis': VOLTAGE_BASIS_LABELS,
  }
  return maps[path] ? labelOf(maps[path], value) : value
}

export const packToOrderSection: PdfSection = (doc, d) => {
  const r = d.results
  heading(doc, 'Pack to order')
  pair(doc, 'Chemistry', labelOf(CHEMISTRY_LABELS, String(r.chemistry)))
  pair(doc, 'Nominal pack voltage', formatFigure(r.nominalVoltageV, 'V'))
  pair(doc, 'Cells in series', formatFigure(r.cellsInSeries))
  pair(doc, 'Capacity', formatFigure(r.selectedCapacityAh, 'Ah'))
  pair(doc, 'Cell format', typeof r.cellFormat === 'string' && r.cellFormat ? r.cellFormat : 'not given: check the fit and the connector')
}

export const chargerCheckSection: PdfSection = (doc, d) => {
  const c = d.results.chargerCheck as Record<string, unknown> | null | undefined
  if (!c) return
  heading(doc, 'Charger check')
  pair(doc, 'Charger', labelOf(CHARGER_TYPE_LABELS, String(c.chargerType)))
  if (c.chargerType === 'unknown') pair(doc, 'Judged as', labelOf(CHARGER_TYPE_LABELS, String(c.assumedChargerType)))
  pair(doc, 'Verdict', labelOf(CHARGER_FIT_LABELS, String(c.compatible)))
  pair(doc, 'Charge current', `${formatFigure(c.chargeCurrentA, 'A')} (${formatFigure(c.chargeCRate, 'C')})`)
  pair(doc, 'Permanent (trickle) current', `${formatFigure(c.trickleCurrentA, 'A')} (${formatFigure(c.trickleCRate, 'C')})`)
  pair(doc, 'Charge taken by a full test', formatFigure(c.dischargeAh, 'Ah'))
  pair(doc, 'Recharge after a full test', `${formatFigure(c.rechargeTimeH, 'h')}${c.rechargeWithin24h ? ', within 24 h' : ', more than 24 h'}`)
  for (const reason of (c.reasons ?? []) as string[]) write(doc, reason, { size: 9.5 })
  for (const w of ((c.warnings ?? []) as EngineWarning[]).filter((x) => x.severity !== 'info')) {
    ensureSpace(doc, 24)
    write(doc, `${SEVERITY_LABELS[w.severity]}: `, { weight: 'semibold', continued: true, size: 9.5, color: w.severity === 'critical' ? '#a3161a' : '#a4460f' })
    write(doc, w.message, { size: 9.5 })
  }
}

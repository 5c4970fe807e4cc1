/**
 * The "Wattage audits" section of a specification sheet's PDF: each audit attached to the sheet,
 * with the claim against the readings, the figures, and its warnings in plain sentences.
 */
import type { EngineWarning } from '../../../shared/engine/types'
import { CLAIM_MEANING_LABELS, CLAIM_VERDICT_PHRASES, labelOf, SEVERITY_LABELS } from '../../../shared/labels'
import { DEFAULT_PREFS, formatDate, formatNumber } from '../../../shared/format'
import { AUDIT_RESULT_FIGURES, auditFigureText, plainAuditWarnings } from '../../../shared/schemas/wattage-audit-text'
import { ensureSpace, heading, pair, write } from '../../lib/pdf/pdf-kit'
import type { PdfSection } from '../sheets/sheet-pdf'
import type { AuditDto } from './audits.service'

export function wattageAuditsSection(audits: AuditDto[]): PdfSection {
  return (doc, d) => {
    const prefs = d.prefs ?? DEFAULT_PREFS
    heading(doc, 'Wattage audits')
    write(doc, 'Readings taken on luminaires against the power their makers declare. Attached audits are listed whatever the revision shown.', {
      size: 9,
      color: '#3c4a52',
    })
    for (const a of audits) {
      const r = a.results as Record<string, unknown>
      ensureSpace(doc, 120)
      doc.moveDown(0.4)
      write(doc, a.title, { weight: 'semibold', size: 11.5, color: '#1f3b4d' })
      if (a.luminaire) write(doc, a.luminaire, { size: 9.5 })
      write(doc, `Recorded by ${a.author?.name ?? '—'} on ${formatDate(a.createdAt, prefs)} · engine ${a.engineVersion}`, { size: 8.5, color: '#5b6b75' })
      pair(doc, 'Claimed power', formatNumber(a.claimedPowerW, { unit: 'W' }, prefs))
      pair(
        doc,
        'Verdict',
        `${formatNumber(r.measuredPowerW, { unit: 'W' }, prefs)} measured: ${labelOf(CLAIM_VERDICT_PHRASES, String(r.claimVerdict))}; the claim most likely describes ${labelOf(CLAIM_MEANING_LABELS, String(r.claimLikelyMeans))}`,
      )
      for (const f of AUDIT_RESULT_FIGURES) {
        if (f.key === 'measuredPowerW') continue
        const text = auditFigureText(r, f)
        if (text !== null) pair(doc, f.label, text)
      }
      if (typeof r.claimExplanation === 'string') write(doc, r.claimExplanation, { size: 9.5 })
      const warnings = plainAuditWarnings((r.warnings ?? []) as EngineWarning[]).filter((w) => w.severity !== 'info')
      for (const w of warnings) {
        ensureSpace(doc, 24)
        write(doc, `${SEVERITY_LABELS[w.severity]}: `, {
          weight: 'semibold',
          continued: true,
          size: 9.5,
          color: w.severity === 'critical' ? '#a3161a' : '#a4460f',
        })
        write(doc, w.message, { size: 9.5 })
      }
    }
  }
}

/**
 * The sheet's sections with the audits section placed before the cautions (or at the end when
 * there is no cautions section); a sheet without audits keeps its sections as they are.
 */
export function withWattageAudits(sections: PdfSection[], audits: AuditDto[], cautions?: PdfSection): PdfSection[] {
  if (!audits.length) return sections
  const out = [...sections]
  const at = cautions ? out.indexOf(cautions) : -1
  out.splice(at < 0 ? out.length : at, 0, wattageAuditsSection(audits))
  return out
}

/**
 * Demo specification sheets: invented buildings and luminaires, written and issued by the demo
 * designer, each with a short revision history. Idempotent: a sheet whose reference exists is skipped.
 */
import type { EntityManager } from 'typeorm'
import { ENGINE_VERSION } from '../../shared/engine/version'
import { computeResults, contentOf } from '../modules/sheets/sheets.service'
import { SpecRevision } from '../modules/sheets/spec-revision.entity'
import { SpecSheet } from '../modules/sheets/spec-sheet.entity'
import type { DemoContext } from './accounts.demo'

interface DemoRevision {
  content: Record<string, unknown>
  issue?: boolean
}

const library = {
  title: 'Quillfield Town Library — escape routes',
  reference: 'QTL-EM-03',
  client: 'Quillfield Library Trust (invented)',
  site: 'Quillfield Town Library, reading rooms and stairs',
  luminaire: 'Slim recessed LED downlight for escape routes, non-maintained, converter-driven, 3 h. Ceiling void about 22 °C.',
}
const careHome = {
  title: 'Wrenhollow Care Residence — bedroom corridors',
  reference: 'WCR-EM-11',
  client: 'Wrenhollow Care Ltd (invented)',
  site: 'Wrenhollow Care Residence, east wing',
  luminaire: 'Surface bulkhead, maintained, 3 h, mounted under a warm ceiling above the heating runs; battery compartment reaches about 45 °C.',
}
const warehouse = {
  title: 'Saltmarsh Distribution Shed 2 — aisle exits',
  reference: 'SDS-EM-02',
  client: 'Saltmarsh Logistics (invented)',
  site: 'Saltmarsh Distribution Park, shed 2 (unheated)',
  luminaire: 'High-mounted LED exit and open area unit, non-maintained, 3 h; the shed falls to −15 °C on winter nights.',
}

const SHEETS: DemoRevision[][] = [
  [
    {
      content: {
        ...library,
        inputs: {
          chemistry: 'nicd',
          duration: '3 h',
          driver: 'converter',
          load: { power: '2.4 W' },
          driverEfficiency: 0.82,
          ambientMin: '12 °C',
          ambientMax: '25 °C',
        },
      },
      issue: true,
    },
    {
      content: {
        ...library,
        inputs: {
          chemistry: 'nicd',
          duration: '3 h',
          driver: 'converter',
          load: { power: '2.9 W' },
          driverEfficiency: 0.82,
          ambientMin: '12 °C',
          ambientMax: '25 °C',
        },
      },
      issue: true,
    },
  ],
  [
    {
      content: {
        ...careHome,
        inputs: {
          chemistry: 'nicd-ht',
          duration: '3 h',
          driver: 'converter',
          load: { power: '3.2 W', mainsPower: '7 W' },
          driverEfficiency: 0.85,
          ambientMin: '18 °C',
          ambientMax: '45 °C',
        },
      },
      issue: true,
    },
    {
      content: {
        ...careHome,
        inputs: {
          chemistry: 'nicd-ht',
          duration: '3 h',
          driver: 'converter',
          load: { power: '3.2 W', mainsPower: '7 W' },
          driverEfficiency: 0.85,
          ambientMin: '18 °C',
          ambientMax: '48 °C',
          designMargin: 0.15,
        },
      },
    },
  ],
  [
    {
      content: {
        ...warehouse,
        inputs: {
          chemistry: 'nicd',
          duration: '3 h',
          driver: 'converter',
          load: { power: '6 W' },
          driverEfficiency: 0.85,
          ambientMin: '-15 °C',
          ambientMax: '25 °C',
        },
      },
      issue: true,
    },
  ],
]

export async function seedSheets(m: EntityManager, ctx: DemoContext): Promise<void> {
  const author = ctx.users.designer
  const sheets = m.getRepository(SpecSheet)
  const revisions = m.getRepository(SpecRevision)
  for (const history of SHEETS) {
    const first = contentOf(history[0].content)
    if (await sheets.findOne({ where: { workspaceId: ctx.workspaceId, reference: first.reference } })) continue
    let sheet: SpecSheet | null = null
    for (const [i, step] of history.entries()) {
      const c = contentOf(step.content)
      const fields = {
        title: c.title,
        reference: c.reference,
        client: c.client,
        site: c.site,
        luminaire: c.luminaire,
        inputs: c.inputs,
        results: computeResults(c.inputs),
        engineVersion: ENGINE_VERSION,
      }
      sheet = sheet
        ? Object.assign(sheet, fields, { currentRevision: i + 1, status: 'draft', version: sheet.version + 1 })
        : sheets.create({
            ...fields,
            workspaceId: ctx.workspaceId,
            chemistry: String(c.inputs.chemistry),
            status: 'draft',
            currentRevision: 1,
            issuedRevision: null,
            version: 1,
            createdBy: author,
            updatedBy: author,
            archivedAt: null,
          })
      await sheets.save(sheet)
      await revisions.save(
        revisions.create({
          ...fields,
          workspaceId: ctx.workspaceId,
          sheetId: sheet.id,
          number: i + 1,
          sheetVersion: sheet.version,
          status: 'draft',
          authorId: author,
          issuedAt: null,
          issuedBy: null,
        }),
      )
      if (step.issue) {
        if (sheet.issuedRevision !== null) await revisions.update({ sheetId: sheet.id, number: sheet.issuedRevision }, { status: 'superseded' })
        await revisions.update({ sheetId: sheet.id, number: i + 1 }, { status: 'issued', issuedAt: new Date(), issuedBy: author })
        Object.assign(sheet, { status: 'issued', issuedRevision: i + 1, version: sheet.version + 1 })
        await sheets.save(sheet)
      }
    }
  }
}

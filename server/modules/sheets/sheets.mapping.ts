/** How sheet and revision rows become the API's answers (people as {id, name}; no workspace ids). */
import type { SheetSnapshot } from '../../../shared/schemas/sheet-diff'
import type { SpecRevision } from './spec-revision.entity'
import type { SpecSheet } from './spec-sheet.entity'

export const personNamed = (id: string | null, name: string | null | undefined) => (id ? { id, name: name ?? 'Former member' } : null)
export const person = (names: Map<string, string>, id: string | null) => personNamed(id, id ? names.get(id) : null)

export type SheetFields = Omit<SpecSheet, 'workspaceId' | 'selectedCapacityAh' | 'requiredCapacityAh'>

export function sheetView(s: SheetFields, names: Map<string, string>) {
  return {
    id: s.id,
    title: s.title,
    reference: s.reference,
    client: s.client,
    site: s.site,
    luminaire: s.luminaire,
    chemistry: s.chemistry,
    inputs: s.inputs,
    results: s.results,
    engineVersion: s.engineVersion,
    status: s.status,
    currentRevision: s.currentRevision,
    issuedRevision: s.issuedRevision,
    version: s.version,
    createdBy: person(names, s.createdBy),
    updatedBy: person(names, s.updatedBy),
    archivedAt: s.archivedAt,
    createdAt: s.createdAt,
    updatedAt: s.updatedAt,
  }
}

export function revisionView(r: SpecRevision, names: Map<string, string>) {
  return {
    number: r.number,
    status: r.status,
    title: r.title,
    reference: r.reference,
    client: r.client,
    site: r.site,
    luminaire: r.luminaire,
    inputs: r.inputs,
    results: r.results,
    engineVersion: r.engineVersion,
    author: person(names, r.authorId),
    createdAt: r.createdAt,
    issuedAt: r.issuedAt,
    issuedBy: person(names, r.issuedBy),
  }
}

export type RevisionView = ReturnType<typeof revisionView>

/** The short form of a revision in the revision list. */
export function revisionListItem(r: SpecRevision, names: Map<string, string>) {
  const v = revisionView(r, names)
  return {
    number: v.number,
    status: v.status,
    title: v.title,
    engineVersion: v.engineVersion,
    author: v.author,
    createdAt: v.createdAt,
    issuedAt: v.issuedAt,
    issuedBy: v.issuedBy,
  }
}

/** What the stale-save diff compares. */
export const snapshot = (x: SpecSheet | SpecRevision): SheetSnapshot => ({
  title: x.title,
  reference: x.reference,
  client: x.client,
  site: x.site,
  luminaire: x.luminaire,
  inputs: x.inputs,
  results: x.results,
  engineVersion: x.engineVersion,
})

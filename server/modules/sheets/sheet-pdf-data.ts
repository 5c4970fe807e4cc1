/** What a sheet's PDF sections read: its own file, so section files and the document need not import each other. */
import type { PdfSection as GenericPdfSection } from '../../lib/pdf/pdf-kit'
import type { RevisionView } from './sheets.service'

export interface SheetPdfData extends RevisionView {
  /** Shown at the top right; the workspace that issued the sheet. */
  issuer?: string
}

export type PdfSection<D = SheetPdfData> = GenericPdfSection<D>

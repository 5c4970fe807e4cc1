/**
 * A plain table for documents: columns of fixed width, cells wrapped at spaces inside their
 * column, the header row written again at the top of each new page.
 */
import { heightOf, writeAt, type Doc } from './pdf-kit'

export interface TableColumn {
  title: string
  width: number
}

export function table(doc: Doc, columns: TableColumn[], rows: string[][], opts: { size?: number } = {}) {
  const left = doc.page.margins.left
  const size = opts.size ?? 8.5
  const total = columns.reduce((s, c) => s + c.width, 0)
  const drawHeader = () => {
    const y = doc.y
    const height = Math.max(...columns.map((c) => heightOf(doc, c.title, c.width - 4, { weight: 'semibold', size })))
    let x = left
    for (const c of columns) {
      writeAt(doc, c.title, x, y, { weight: 'semibold', size, width: c.width - 4 })
      x += c.width
    }
    doc.moveTo(left, y + height + 2).lineTo(left + total, y + height + 2).lineWidth(0.5).strokeColor('#8a989f').stroke()
    doc.x = left
    doc.y = y + height + 5
  }
  if (doc.y + 40 > doc.page.height - doc.page.margins.bottom) doc.addPage()
  drawHeader()
  for (const row of rows) {
    const height = Math.max(...row.map((cell, i) => heightOf(doc, cell, columns[i].width - 4, { size })))
    if (doc.y + height > doc.page.height - doc.page.margins.bottom - 4) {
      doc.addPage()
      drawHeader()
    }
    const y = doc.y
    let x = left
    row.forEach((cell, i) => {
      writeAt(doc, cell, x, y, { size, width: columns[i].width - 4 })
      x += columns[i].width
    })
    doc.x = left
    doc.y = y + height + 3
  }
}

/** Column widths scaled to fill the page's body width, in the given proportions. */
export function columnsFor(doc: Doc, spec: Array<[string, number]>): TableColumn[] {
  const width = doc.page.width - doc.page.margins.left - doc.page.margins.right
  const sum = spec.reduce((s, [, w]) => s + w, 0)
  return spec.map(([title, w]) => ({ title, width: (w / sum) * width }))
}

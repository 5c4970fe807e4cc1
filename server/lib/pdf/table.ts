/**
 * The one table of our documents: columns of fixed width (set for A4, shrunk in proportion on
 * narrower paper), cells wrapped at spaces inside their column, the header row written again at the
 * top of each new page, an optional pass or fail mark drawn as a tick or a cross beside a cell's word
 * (so a result reads the same printed in black and white), and optional write-in rows for a sheet
 * filled in by hand.
 */
import { heightOf, writeAt, type Doc, type Weight } from './pdf-kit'

export interface Column {
  title: string
  width: number
}

/** A cell: plain text, or text with a pass / fail mark drawn before it. */
export type Cell = string | { text: string; mark?: 'pass' | 'fail'; weight?: Weight }

const MARK_W = 10
const textOf = (c: Cell) => (typeof c === 'string' ? c : c.text)
const markOf = (c: Cell) => (typeof c === 'string' ? undefined : c.mark)

/** A tick (pass) or a cross (fail), 7 pt high, drawn in lines so it needs no glyph and no colour. */
export function drawMark(doc: Doc, mark: 'pass' | 'fail', x: number, y: number) {
  doc.save().lineWidth(1.3).strokeColor('#1b2a33').lineCap('round')
  if (mark === 'pass')
    doc
      .moveTo(x, y + 4)
      .lineTo(x + 2.6, y + 7)
      .lineTo(x + 7.5, y + 0.5)
      .stroke()
  else
    doc
      .moveTo(x + 0.5, y + 0.5)
      .lineTo(x + 7, y + 7)
      .moveTo(x + 7, y + 0.5)
      .lineTo(x + 0.5, y + 7)
      .stroke()
  doc.restore()
}

export interface TableOptions {
  size?: number
  /** Rows at least this tall, with a rule under each: a sheet to be filled in by hand. */
  writeIn?: number
}

/** A plain table that starts a new page (with its header again) when the page is full. */
export function table(doc: Doc, given: Column[], rows: Cell[][], options: TableOptions = {}) {
  const size = options.size ?? 8.5
  const left = doc.page.margins.left
  // Widths are set for A4; on narrower paper (Letter) every column shrinks in proportion so the table stays on the page.
  const room = doc.page.width - left - doc.page.margins.right
  const total = given.reduce((sum, c) => sum + c.width, 0)
  const columns = total > room ? given.map((c) => ({ ...c, width: (c.width * room) / total })) : given
  const tableWidth = columns.reduce((s, c) => s + c.width, 0)
  const drawHeader = () => {
    const y = doc.y
    const height = Math.max(...columns.map((c) => heightOf(doc, c.title, c.width - 4, { weight: 'semibold', size })))
    let x = left
    for (const c of columns) {
      writeAt(doc, c.title, x, y, { weight: 'semibold', size, width: c.width - 4 })
      x += c.width
    }
    doc
      .moveTo(left, y + height + 2)
      .lineTo(left + tableWidth, y + height + 2)
      .lineWidth(0.5)
      .strokeColor('#1b2a33')
      .stroke()
    doc.x = left
    doc.y = y + height + 5
  }
  // Not a header alone at the foot of a page.
  if (doc.y + 40 > doc.page.height - doc.page.margins.bottom) doc.addPage()
  drawHeader()
  for (const row of rows) {
    const inner = (cell: Cell, i: number) => columns[i].width - 4 - (markOf(cell) ? MARK_W : 0)
    const height = Math.max(
      options.writeIn ?? 0,
      ...row.map((cell, i) => heightOf(doc, textOf(cell), inner(cell, i), { size, weight: typeof cell === 'string' ? 'regular' : cell.weight })),
    )
    if (doc.y + height > doc.page.height - doc.page.margins.bottom - 14) {
      doc.addPage()
      drawHeader()
    }
    const y = doc.y
    let x = left
    row.forEach((cell, i) => {
      const mark = markOf(cell)
      if (mark) drawMark(doc, mark, x, y + 2)
      writeAt(doc, textOf(cell), x + (mark ? MARK_W : 0), y, { size, width: inner(cell, i), weight: typeof cell === 'string' ? 'regular' : cell.weight })
      x += columns[i].width
    })
    if (options.writeIn)
      doc
        .moveTo(left, y + height + 1)
        .lineTo(left + tableWidth, y + height + 1)
        .lineWidth(0.4)
        .strokeColor('#8a989f')
        .stroke()
    doc.x = left
    doc.y = y + height + 3
  }
}

/** The result cell of a test: the word, in semibold for a fail, after its mark. */
export const resultCell = (passed: boolean): Cell => ({
  text: passed ? 'Pass' : 'Fail',
  mark: passed ? 'pass' : 'fail',
  weight: passed ? 'regular' : 'semibold',
})

/** Column widths scaled to fill the page's body width, in the given proportions. */
export function columnsFor(doc: Doc, spec: Array<[string, number]>): Column[] {
  const width = doc.page.width - doc.page.margins.left - doc.page.margins.right
  const sum = spec.reduce((s, [, w]) => s + w, 0)
  return spec.map(([title, w]) => ({ title, width: (w / sum) * width }))
}

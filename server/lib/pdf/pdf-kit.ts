/**
 * PDF building blocks on pdfkit with the shipped Source Sans 3 embedded. The font comes split in
 * subsets (latin, latin-ext, greek); each run of text goes to the subset that has its glyphs, read
 * from the unicode ranges the font package declares, and the few symbols no subset has are spelt out.
 */
import fs from 'node:fs'
import { createRequire } from 'node:module'
import path from 'node:path'
import PDFDocument from 'pdfkit'

const require = createRequire(import.meta.url)
const FONT_DIR = path.dirname(require.resolve('@fontsource/source-sans-3/package.json'))
const SUBSETS = ['latin', 'latin-ext', 'greek'] as const
export type Weight = 'regular' | 'semibold'
const WEIGHT_NUMBER: Record<Weight, number> = { regular: 400, semibold: 600 }

interface Subset {
  name: string
  file: Buffer
  ranges: Array<[number, number]>
}

/** Symbols outside every subset, written in plain characters instead. */
const SPELT_OUT: Record<string, string> = { '≥': '>=', '≤': '<=', '→': '->', '←': '<-', '≈': '~', '√': 'sqrt', '∞': 'inf' }

let subsetsByWeight: Record<Weight, Subset[]> | null = null

function loadSubsets(): Record<Weight, Subset[]> {
  if (subsetsByWeight) return subsetsByWeight
  const out = {} as Record<Weight, Subset[]>
  for (const weight of ['regular', 'semibold'] as Weight[]) {
    const n = WEIGHT_NUMBER[weight]
    const css = fs.readFileSync(path.join(FONT_DIR, `${n}.css`), 'utf8')
    // The package's own @font-face blocks, one per subset, each opening with a comment naming it.
    const blocks = css.split('/* ').slice(1)
    out[weight] = SUBSETS.map((name) => {
      const block = blocks.find((b) => b.startsWith(`source-sans-3-${name}-${n}-normal */`))
      const m = block?.match(/unicode-range:\s*([^;]+);/)
      if (!m) throw new Error(`Source Sans 3: no unicode-range for ${name} ${n}`)
      const ranges = m[1].split(',').map((part) => {
        const [a, b] = part.trim().replace(/^U\+/i, '').split('-')
        return [parseInt(a, 16), parseInt(b ?? a, 16)] as [number, number]
      })
      return { name, file: fs.readFileSync(path.join(FONT_DIR, 'files', `source-sans-3-${name}-${n}-normal.woff`)), ranges }
    })
  }
  subsetsByWeight = out
  return out
}

const fontName = (weight: Weight, subset: string) => `SourceSans3-${weight}-${subset}`

export type Doc = PDFKit.PDFDocument

/** One part of a document: writes its data onto the document, page breaks included. */
export type PdfSection<D> = (doc: Doc, data: D) => void

/**
 * Every page has a header band and a footer band that body text never enters: the body's margins
 * start below and end above them, and `frame` writes into them once the pages are laid out.
 */
export const BANDS = { header: 34, footer: 38, gap: 14 } as const

/** A new A4 or Letter document with the font subsets registered (A4, portrait with wide margins unless told). */
export function newDocument(
  info: { title: string; subject?: string },
  page: { layout?: 'portrait' | 'landscape'; margin?: number; paper?: 'a4' | 'letter' } = {},
): Doc {
  const side = page.margin ?? 56
  const margins = {
    top: Math.max(page.margin ?? 56, BANDS.header + BANDS.gap),
    bottom: Math.max(page.margin ?? 64, BANDS.footer + BANDS.gap),
    left: side,
    right: side,
  }
  const doc = new PDFDocument({
    size: page.paper === 'letter' ? 'LETTER' : 'A4',
    layout: page.layout ?? 'portrait',
    margins,
    bufferPages: true,
    info: { Title: info.title, Subject: info.subject ?? '', Creator: 'Lampwright' },
  })
  const subsets = loadSubsets()
  for (const weight of Object.keys(subsets) as Weight[]) for (const s of subsets[weight]) doc.registerFont(fontName(weight, s.name), s.file)
  doc.font(fontName('regular', 'latin'))
  return doc
}

/** Splits text into runs, each with the subset that holds its glyphs. */
export function textRuns(text: string, weight: Weight): Array<{ font: string; text: string }> {
  const subsets = loadSubsets()[weight]
  const runs: Array<{ font: string; text: string }> = []
  for (const raw of text.normalize('NFC')) {
    const chars = SPELT_OUT[raw] ?? raw
    for (const ch of chars) {
      const cp = ch.codePointAt(0) as number
      const subset = subsets.find((s) => s.ranges.some(([a, b]) => cp >= a && cp <= b)) ?? subsets[0]
      const glyph = subsets.some((s) => s === subset && s.ranges.some(([a, b]) => cp >= a && cp <= b)) ? ch : '?'
      const font = fontName(weight, subset.name)
      const last = runs[runs.length - 1]
      if (last && last.font === font) last.text += glyph
      else runs.push({ font, text: glyph })
    }
  }
  return runs
}

export interface WriteOptions extends PDFKit.Mixins.TextOptions {
  weight?: Weight
  size?: number
  color?: string
}

/**
 * Writes a paragraph (or a continued piece) in Source Sans 3, switching subsets as needed. `x` and
 * `y` in the options place its first line (pdfkit reads them only as arguments, never as options).
 */
export function write(doc: Doc, text: string, opts: WriteOptions = {}): Doc {
  const { x, y, ...rest } = opts as WriteOptions & { x?: number; y?: number }
  if (x !== undefined || y !== undefined) return writeAt(doc, text, x ?? doc.x, y ?? doc.y, rest)
  const { weight = 'regular', size = 10, color = '#1b2a33', ...textOpts } = rest
  doc.fontSize(size).fillColor(color)
  const runs = textRuns(text || ' ', weight)
  runs.forEach((run, i) => {
    doc.font(run.font)
    const last = i === runs.length - 1
    doc.text(run.text, { ...textOpts, continued: last ? (textOpts.continued ?? false) : true })
  })
  return doc
}

/** Writes text at a position (a table cell), switching subsets as needed. */
export function writeAt(doc: Doc, text: string, x: number, y: number, opts: WriteOptions = {}): Doc {
  const { weight = 'regular', size = 10, color = '#1b2a33', ...textOpts } = opts
  doc.fontSize(size).fillColor(color)
  const runs = textRuns(text || ' ', weight)
  runs.forEach((run, i) => {
    doc.font(run.font)
    const more = i < runs.length - 1 || (textOpts.continued ?? false)
    if (i === 0) doc.text(run.text, x, y, { ...textOpts, continued: more })
    else doc.text(run.text, { ...textOpts, continued: more })
  })
  return doc
}

/** Height of text in a column, measured in the font of its first run (close enough for table rows). */
export function heightOf(doc: Doc, text: string, width: number, opts: { weight?: Weight; size?: number } = {}): number {
  const runs = textRuns(text || ' ', opts.weight ?? 'regular')
  doc.font(runs[0].font).fontSize(opts.size ?? 10)
  return doc.heightOfString(runs.map((r) => r.text).join(''), { width })
}

export function heading(doc: Doc, text: string) {
  ensureSpace(doc, 60)
  doc.moveDown(0.6)
  write(doc, text, { weight: 'semibold', size: 13, color: '#1f3b4d' })
  const y = doc.y + 2
  doc
    .moveTo(doc.page.margins.left, y)
    .lineTo(doc.page.width - doc.page.margins.right, y)
    .lineWidth(0.6)
    .strokeColor('#c98a12')
    .stroke()
  doc.moveDown(0.4)
}

/** Label and value on one line (the label in semibold). */
export function pair(doc: Doc, label: string, value: string) {
  ensureSpace(doc, 16)
  doc.x = doc.page.margins.left
  write(doc, `${label}: `, { weight: 'semibold', continued: true })
  write(doc, value)
}

/** Starts a new page unless `height` more points fit above the footer band. */
export function ensureSpace(doc: Doc, height: number) {
  if (doc.y + height > doc.page.height - doc.page.margins.bottom) doc.addPage()
}

export interface FrameText {
  /** Left of the header band: what the document is. */
  header: string
  /** Right of the header band: who issued it. */
  headerRight?: string
  /** Left of the footer band; "Page n of N" goes on the right. */
  footer: string
}

/**
 * Writes the header and footer bands on every page once the content is laid out: a title line and
 * a rule at the top, a rule, a line and "Page n of N" at the bottom. Body text never reaches the
 * bands (see BANDS), so nothing here is printed over it.
 */
export function frame(doc: Doc, text: FrameText) {
  const range = doc.bufferedPageRange()
  for (let i = range.start; i < range.start + range.count; i++) {
    doc.switchToPage(i)
    const { left, right, bottom } = doc.page.margins
    const width = doc.page.width - left - right
    const h = doc.page.height
    // The bands lie outside the body's margins: lift the bottom margin so pdfkit adds no page.
    doc.page.margins.bottom = 0
    const pageText = `Page ${i + 1 - range.start} of ${range.count}`
    const small = { size: 8, color: '#5b6b75', lineBreak: false } as const
    writeAt(doc, text.header, left, 16, { ...small, width: text.headerRight ? width * 0.62 : width, ellipsis: true })
    if (text.headerRight) writeAt(doc, text.headerRight, left + width * 0.64, 16, { ...small, width: width * 0.36, align: 'right', ellipsis: true })
    doc
      .moveTo(left, BANDS.header - 6)
      .lineTo(left + width, BANDS.header - 6)
      .lineWidth(0.4)
      .strokeColor('#c5ced3')
      .stroke()
    doc
      .moveTo(left, h - BANDS.footer + 4)
      .lineTo(left + width, h - BANDS.footer + 4)
      .lineWidth(0.4)
      .strokeColor('#c5ced3')
      .stroke()
    writeAt(doc, text.footer, left, h - BANDS.footer + 12, { ...small, width: width - 80, ellipsis: true })
    writeAt(doc, pageText, left + width - 78, h - BANDS.footer + 12, { ...small, width: 78, align: 'right' })
    doc.page.margins.bottom = bottom
  }
}

/** "Page n of m" and a short line on every page (the footer band only); see `frame`. */
export function footers(doc: Doc, line: string) {
  frame(doc, { header: '', footer: line })
}

export interface SignOffBox {
  /** What the signer signs for, e.g. "Installed and tested by". */
  role: string
  name?: string
  date?: string
}

/**
 * Boxes for signatures, side by side, each with the role, a name, a signature line and a date;
 * a name or date already known is printed in its box. Kept together on one page.
 */
export function signOffBoxes(doc: Doc, boxes: SignOffBox[]) {
  const height = 96
  ensureSpace(doc, height + 10)
  const { left, right } = doc.page.margins
  const gap = 12
  const width = (doc.page.width - left - right - gap * (boxes.length - 1)) / boxes.length
  const top = doc.y + 4
  boxes.forEach((b, i) => {
    const x = left + i * (width + gap)
    doc.rect(x, top, width, height).lineWidth(0.6).strokeColor('#8a989f').stroke()
    writeAt(doc, b.role, x + 8, top + 6, { weight: 'semibold', size: 9, width: width - 16, lineBreak: false, ellipsis: true })
    const rows: Array<[string, string]> = [
      ['Name', b.name ?? ''],
      ['Signature', ''],
      ['Date', b.date ?? ''],
    ]
    rows.forEach(([label, value], k) => {
      const y = top + 28 + k * 22
      writeAt(doc, label, x + 8, y, { size: 8, color: '#5b6b75', lineBreak: false })
      doc
        .moveTo(x + 58, y + 11)
        .lineTo(x + width - 8, y + 11)
        .lineWidth(0.4)
        .strokeColor('#8a989f')
        .stroke()
      if (value) writeAt(doc, value, x + 60, y, { size: 9, width: width - 70, lineBreak: false, ellipsis: true })
    })
  })
  doc.x = left
  doc.y = top + height + 10
}

/** Collects the finished document into one buffer. */
export function toBuffer(doc: Doc): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    const chunks: Buffer[] = []
    doc.on('data', (c: Buffer) => chunks.push(c))
    doc.on('end', () => resolve(Buffer.concat(chunks)))
    doc.on('error', reject)
    doc.end()
  })
}

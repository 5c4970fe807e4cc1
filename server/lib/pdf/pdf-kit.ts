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

/** A new A4 document with the font subsets registered (portrait with wide margins unless told). */
export function newDocument(info: { title: string; subject?: string }, page: { layout?: 'portrait' | 'landscape'; margin?: number } = {}): Doc {
  const margins = page.margin !== undefined ? { top: page.margin, bottom: page.margin, left: page.margin, right: page.margin } : { top: 56, bottom: 64, left: 56, right: 56 }
  const doc = new PDFDocument({ size: 'A4', layout: page.layout ?? 'portrait', margins, bufferPages: true, info: { Title: info.title, Subject: info.subject ?? '', Creator: 'Lampwright' } })
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

/** Writes a paragraph (or a continued piece) in Source Sans 3, switching subsets as needed. */
export function write(doc: Doc, text: string, opts: WriteOptions = {}): Doc {
  const { weight = 'regular', size = 10, color = '#1b2a33', ...textOpts } = opts
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
    const more = i < runs.length - 1
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
  doc.moveTo(doc.page.margins.left, y).lineTo(doc.page.width - doc.page.margins.right, y).lineWidth(0.6).strokeColor('#c98a12').stroke()
  doc.moveDown(0.4)
}

/** Label and value on one line (the label in semibold). */
export function pair(doc: Doc, label: string, value: string) {
  ensureSpace(doc, 16)
  const left = doc.page.margins.left
  write(doc, `${label}: `, { weight: 'semibold', continued: true, x: left } as WriteOptions)
  write(doc, value)
}

export function ensureSpace(doc: Doc, height: number) {
  if (doc.y + height > doc.page.height - doc.page.margins.bottom) doc.addPage()
}

/** "Page n of m" and a short line on every page, once the content is laid out. */
export function footers(doc: Doc, line: string) {
  const range = doc.bufferedPageRange()
  for (let i = range.start; i < range.start + range.count; i++) {
    doc.switchToPage(i)
    const bottom = doc.page.margins.bottom
    doc.page.margins.bottom = 0
    write(doc, `${line}   ·   Page ${i + 1} of ${range.count}`, { size: 8, color: '#5b6b75', x: doc.page.margins.left, y: doc.page.height - 40, width: doc.page.width - doc.page.margins.left - doc.page.margins.right, align: 'center', lineBreak: false } as WriteOptions)
    doc.page.margins.bottom = bottom
  }
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

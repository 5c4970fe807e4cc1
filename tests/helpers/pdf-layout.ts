/**
 * Where each piece of text sits on each page of a PDF the app wrote, for layout tests. Follows the
 * PDF format (ISO 32000-1): pages in /Kids order (7.7.3.2), the graphics state stack q/Q and cm
 * (8.4.4), the text matrix Tm (9.4.2), the font size Tf, glyph widths from the CIDFont /W array
 * (9.7.4.3) and TJ adjustments in thousandths of an em (9.4.3). Boxes are top-down, in points.
 */
import { parseCMap, readObjects, type PdfObject } from './pdf-text'

export interface TextBox {
  page: number
  text: string
  size: number
  /** Left edge and width along the line. */
  x: number
  width: number
  /** Baseline, measured from the top of the page. */
  baseline: number
  /** Top and bottom of the glyphs' usual extent (ascent 0.8 em, descent 0.2 em). */
  top: number
  bottom: number
}

export interface PdfPage {
  number: number
  width: number
  height: number
  boxes: TextBox[]
}

type Matrix = [number, number, number, number, number, number]
const multiply = (m: Matrix, n: Matrix): Matrix => [
  m[0] * n[0] + m[1] * n[2],
  m[0] * n[1] + m[1] * n[3],
  m[2] * n[0] + m[3] * n[2],
  m[2] * n[1] + m[3] * n[3],
  m[4] * n[0] + m[5] * n[2] + n[4],
  m[4] * n[1] + m[5] * n[3] + n[5],
]

interface FontInfo {
  cmap: Map<number, string>
  widths: Map<number, number>
}

function widthsOf(w: string): Map<number, number> {
  const out = new Map<number, number>()
  // "/W [0 [653 536 ...] 40 [..]]" or "c1 c2 w" ranges.
  const tokens = w.match(/\[|\]|-?[\d.]+/g) ?? []
  let i = 1 // skip the outer "["
  while (i < tokens.length && tokens[i] !== ']') {
    const first = Number(tokens[i++])
    if (tokens[i] === '[') {
      i++
      let c = first
      while (tokens[i] !== ']') out.set(c++, Number(tokens[i++]))
      i++
    } else {
      const last = Number(tokens[i++])
      const width = Number(tokens[i++])
      for (let c = first; c <= last; c++) out.set(c, width)
    }
  }
  return out
}

function fontsOf(objects: Map<string, PdfObject>): Map<string, FontInfo> {
  const byId = new Map<string, FontInfo>()
  for (const [id, obj] of objects) {
    const tu = obj.dict.match(/\/ToUnicode (\d+) 0 R/)
    const desc = obj.dict.match(/\/DescendantFonts \[(\d+) 0 R\]/)
    if (!tu || !desc) continue
    const cmapStream = objects.get(tu[1])?.stream
    const w = objects.get(desc[1])?.dict.match(/\/W (\[[\s\S]*?\]\s*\])/)
    byId.set(id, { cmap: cmapStream ? parseCMap(cmapStream.toString('latin1')) : new Map(), widths: w ? widthsOf(w[1]) : new Map() })
  }
  return byId
}

function pageOrder(objects: Map<string, PdfObject>): string[] {
  const catalog = [...objects.values()].find((o) => /\/Type \/Catalog/.test(o.dict))
  const root = catalog?.dict.match(/\/Pages (\d+) 0 R/)?.[1]
  const out: string[] = []
  const walk = (id: string) => {
    const o = objects.get(id)
    if (!o) return
    if (/\/Type \/Page\b/.test(o.dict)) out.push(id)
    const kids = o.dict.match(/\/Kids \[([^\]]*)\]/)
    if (kids) for (const [, k] of kids[1].matchAll(/(\d+) 0 R/g)) walk(k)
  }
  if (root) walk(root)
  return out
}

/** Every page with the boxes of its text, in the order the text was drawn. */
export function pdfPages(pdf: Buffer): PdfPage[] {
  if (pdf.subarray(0, 5).toString('latin1') !== '%PDF-') throw new Error('not a PDF')
  const objects = readObjects(pdf)
  const fonts = fontsOf(objects)
  return pageOrder(objects).map((pageId, index) => {
    const page = objects.get(pageId) as PdfObject
    const box = (page.dict.match(/\/MediaBox \[([^\]]*)\]/)?.[1] ?? '0 0 595.28 841.89').trim().split(/\s+/).map(Number)
    const [width, height] = [box[2] - box[0], box[3] - box[1]]
    const resources = page.dict.match(/\/Resources (\d+) 0 R/)?.[1]
    const fontNames = new Map<string, FontInfo>()
    for (const fontDict of (resources ? objects.get(resources)?.dict : page.dict)?.matchAll(/\/Font\s*<<([\s\S]*?)>>/g) ?? []) {
      for (const [, name, ref] of fontDict[1].matchAll(/\/([\w.-]+)\s+(\d+) 0 R/g)) {
        const f = fonts.get(ref)
        if (f) fontNames.set(name, f)
      }
    }
    const contentIds = [...(page.dict.match(/\/Contents (?:\[([^\]]*)\]|(\d+) 0 R)/) ?? [])]
      .slice(1)
      .filter(Boolean)
      .flatMap((s) => [...s.matchAll(/(\d+)(?: 0 R)?/g)].map((m) => m[1]))
    const content = contentIds
      .map((id) => objects.get(id)?.stream ?? Buffer.alloc(0))
      .map((b) => b.toString('latin1'))
      .join('\n')
    const boxes: TextBox[] = []
    let ctm: Matrix = [1, 0, 0, 1, 0, 0]
    const stack: Matrix[] = []
    let tm: Matrix = [1, 0, 0, 1, 0, 0]
    let font: FontInfo | undefined
    let size = 10
    const ops =
      /(-?[\d.]+)\s+(-?[\d.]+)\s+(-?[\d.]+)\s+(-?[\d.]+)\s+(-?[\d.]+)\s+(-?[\d.]+)\s+(cm|Tm)\b|\bq\b|\bQ\b|\/([\w.-]+)\s+([\d.]+)\s+Tf|\[((?:[^\]])*)\]\s*TJ|<([0-9a-fA-F]*)>\s*Tj/g
    for (const op of content.matchAll(ops)) {
      if (op[7] === 'cm') ctm = multiply([1, 2, 3, 4, 5, 6].map((i) => Number(op[i])) as Matrix, ctm)
      else if (op[7] === 'Tm') tm = [1, 2, 3, 4, 5, 6].map((i) => Number(op[i])) as Matrix
      else if (op[0] === 'q') stack.push(ctm)
      else if (op[0] === 'Q') ctm = stack.pop() ?? [1, 0, 0, 1, 0, 0]
      else if (op[8]) {
        font = fontNames.get(op[8])
        size = Number(op[9])
      } else {
        const parts = op[10] !== undefined ? [...op[10].matchAll(/<([0-9a-fA-F]*)>|(-?[\d.]+)/g)] : [[`<${op[11]}>`, op[11]] as unknown as RegExpMatchArray]
        let text = ''
        let advance = 0 // in thousandths of an em
        for (const p of parts) {
          if (p[1] === undefined) {
            advance -= Number(p[2])
            continue
          }
          for (let i = 0; i + 4 <= p[1].length; i += 4) {
            const code = parseInt(p[1].slice(i, i + 4), 16)
            text += font?.cmap.get(code) ?? ''
            advance += font?.widths.get(code) ?? 500
          }
        }
        const m = multiply(tm, ctm)
        const x = m[4]
        const yUp = m[5]
        const baseline = height - yUp
        boxes.push({ page: index + 1, text, size, x, width: (advance / 1000) * size, baseline, top: baseline - 0.8 * size, bottom: baseline + 0.2 * size })
      }
    }
    return { number: index + 1, width, height, boxes }
  })
}

/** Pairs of text boxes on a page that cover each other (more than a sliver), with where. */
export function overlaps(page: PdfPage, tolerance = 0.6): Array<{ a: TextBox; b: TextBox }> {
  const out: Array<{ a: TextBox; b: TextBox }> = []
  const boxes = page.boxes.filter((b) => b.text.trim() !== '')
  for (let i = 0; i < boxes.length; i++) {
    for (let j = i + 1; j < boxes.length; j++) {
      const a = boxes[i]
      const b = boxes[j]
      const dx = Math.min(a.x + a.width, b.x + b.width) - Math.max(a.x, b.x)
      const dy = Math.min(a.bottom, b.bottom) - Math.max(a.top, b.top)
      if (dx > tolerance && dy > Math.min(a.size, b.size) * 0.35) out.push({ a, b })
    }
  }
  return out
}

/** The page's lines of text top to bottom (pieces on one baseline joined), for reading in tests. */
export function pageLines(page: PdfPage): string[] {
  const rows = new Map<number, TextBox[]>()
  for (const b of page.boxes) {
    const key = Math.round(b.baseline)
    rows.set(key, [...(rows.get(key) ?? []), b])
  }
  return [...rows.entries()]
    .sort((a, b) => a[0] - b[0])
    .map(([, bs]) =>
      bs
        .sort((a, b) => a.x - b.x)
        .map((b) => b.text)
        .join(''),
    )
}

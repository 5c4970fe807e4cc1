/**
 * Checks every document the app hands over must pass: its text stays out of the header and footer
 * bands, no two pieces of text are printed over each other, every page says "Page n of N", and no
 * enumeration code or engine unit name appears as text.
 */
import { tellTaleCodes } from '../../shared/labels'
import { overlaps, pageLines, pdfPages, type PdfPage } from './pdf-layout'

/** Height of the footer and header bands the PDF toolkit reserves (server/lib/pdf BANDS). */
const FOOTER_BAND = 38
const HEADER_BAND = 34

export interface LayoutProblem {
  page: number
  problem: string
}

export function layoutProblems(pdf: Buffer): LayoutProblem[] {
  const pages = pdfPages(pdf)
  const out: LayoutProblem[] = []
  for (const page of pages) {
    const footerTop = page.height - FOOTER_BAND
    const inFooter = page.boxes.filter((b) => b.text.trim() && b.bottom > footerTop)
    const inHeader = page.boxes.filter((b) => b.text.trim() && b.top < HEADER_BAND)
    const pageLabel = `Page ${page.number} of ${pages.length}`
    const footerText = inFooter.map((b) => b.text).join('')
    if (!footerText.includes(pageLabel)) out.push({ page: page.number, problem: `no "${pageLabel}" in the footer band (found "${footerText}")` })
    // Whatever sits in a band must lie wholly inside it: a body line crossing into it is printed under the footer.
    for (const b of inFooter) if (b.top < footerTop) out.push({ page: page.number, problem: `text crosses into the footer band: "${b.text}"` })
    for (const b of inHeader) if (b.bottom > HEADER_BAND) out.push({ page: page.number, problem: `text crosses into the header band: "${b.text}"` })
    for (const b of page.boxes)
      if (b.text.trim() && (b.x < 0 || b.x + b.width > page.width + 0.5 || b.bottom > page.height))
        out.push({ page: page.number, problem: `text runs off the page: "${b.text}"` })
    for (const { a, b } of overlaps(page))
      out.push({ page: page.number, problem: `"${a.text}" and "${b.text}" are printed over each other at ${Math.round(a.baseline)} pt` })
  }
  return out
}

const CODES = tellTaleCodes()
const escape = (s: string) => s.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')
/** Codes that are also ordinary hyphenated English, written so in sentences. */
const ORDINARY_WORDS = new Set(['non-maintained', 'lead-acid', 'high-risk', 'escape-route'])
const CODE_PATTERN = new RegExp(
  `(?<![\\w-])(${CODES.filter((c) => !ORDINARY_WORDS.has(c))
    .map(escape)
    .join('|')})(?![\\w-])`,
)

/** Enumeration codes, field paths or engine unit names in the text, with the line they are in. */
export function codesIn(lines: string[]): string[] {
  const found: string[] = []
  // A code wrapped at its hyphen ("due-" / "soon") is read again as one piece.
  const joined = lines.flatMap((line, i) => (line.endsWith('-') && lines[i + 1] ? [line, line + lines[i + 1]] : [line]))
  for (const line of joined) {
    const m = CODE_PATTERN.exec(line)
    if (m) found.push(`${m[1]} in "${line.trim().slice(0, 120)}"`)
  }
  return found
}

export function pdfLines(pdf: Buffer): string[] {
  return pdfPages(pdf).flatMap((p: PdfPage) => pageLines(p))
}

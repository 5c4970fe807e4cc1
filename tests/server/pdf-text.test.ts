/**
 * The tests' PDF reader must read every PDF the app writes, whatever bytes its compressed streams
 * happen to hold: a stream is counted by its /Length (ISO 32000-1, 7.3.8), never searched for an
 * end marker, because deflated data can contain "endobj" or "endstream" by chance.
 */
import path from 'node:path'
import { createRequire } from 'node:module'
import PDFDocument from 'pdfkit'
import { describe, expect, it } from 'vitest'
import { pdfText } from '../helpers/pdf-text'

const require = createRequire(import.meta.url)
const FONT = path.join(path.dirname(require.resolve('@fontsource/source-sans-3/package.json')), 'files', 'source-sans-3-latin-400-normal.woff')

function pdfOf(lines: string[]): Promise<Buffer> {
  const doc = new PDFDocument({ compress: true })
  doc.registerFont('body', FONT)
  doc.font('body')
  const chunks: Buffer[] = []
  doc.on('data', (c: Buffer) => chunks.push(c))
  const done = new Promise<Buffer>((resolve) => doc.on('end', () => resolve(Buffer.concat(chunks))))
  for (const line of lines) doc.text(line)
  doc.end()
  return done
}

describe('reading text back out of a PDF', () => {
  it('reads the last line of 300 different documents, whatever their compressed bytes', async () => {
    const misread: number[] = []
    for (let i = 0; i < 300; i++) {
      const lines = Array.from({ length: 30 }, (_, k) => `Line ${i}-${k} ${Math.sin(i * k).toFixed(6)} endobj stream`)
      if (!pdfText(await pdfOf(lines)).includes(`Line ${i}-29`)) misread.push(i)
    }
    expect(misread).toEqual([])
    // 300 documents, each embedding a font: about 25 s here, up to twice that when the machine is slow.
  }, 180_000)

  it('refuses something that is not a PDF', () => {
    expect(() => pdfText(Buffer.from('hello'))).toThrow('not a PDF')
  })
})

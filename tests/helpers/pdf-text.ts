/**
 * Reads the text back out of a PDF that pdfkit wrote with embedded fonts, for tests. No PDF reader
 * package is installed, so this follows the PDF format directly (ISO 32000-1): streams are inflated
 * with node:zlib (FlateDecode, 7.4.4), each font's ToUnicode CMap (9.10.3) maps the 2-byte glyph
 * codes in the Tj/TJ operators (9.4.3) back to Unicode. Each text object (BT…ET) becomes one line.
 */
import zlib from 'node:zlib'

export interface PdfObject {
  dict: string
  stream: Buffer | null
}

export function readObjects(pdf: Buffer): Map<string, PdfObject> {
  const src = pdf.toString('latin1')
  const objects = new Map<string, PdfObject>()
  const header = /(\d+) 0 obj\b/g
  // Direct /Length values first; an indirect one ("/Length 7 0 R") is resolved below.
  const lengthOf = (dict: string): number | null => {
    const direct = dict.match(/\/Length (\d+)(?! \d+ R)/)
    if (direct) return Number(direct[1])
    const ref = dict.match(/\/Length (\d+) 0 R/)
    const target = ref && src.match(new RegExp(`\\b${ref[1]} 0 obj\\s*(\\d+)\\s*endobj`))
    return target ? Number(target[1]) : null
  }
  for (let m = header.exec(src); m; m = header.exec(src)) {
    const bodyStart = m.index + m[0].length
    const streamAt = src.indexOf('stream', bodyStart)
    const endObjAt = src.indexOf('endobj', bodyStart)
    if (endObjAt < 0) break
    if (streamAt < 0 || endObjAt < streamAt) {
      objects.set(m[1], { dict: src.slice(bodyStart, endObjAt), stream: null })
      header.lastIndex = endObjAt
      continue
    }
    // The stream's bytes are counted by /Length (ISO 32000-1, 7.3.8): compressed data may hold
    // any byte sequence, "endobj" included, so it is never searched for inside them.
    const dict = src.slice(bodyStart, streamAt)
    let start = streamAt + 'stream'.length
    if (src[start] === '\r') start++
    if (src[start] === '\n') start++
    const length = lengthOf(dict)
    if (length === null) throw new Error(`object ${m[1]}: stream without a readable /Length`)
    let data: Buffer = pdf.subarray(start, start + length)
    if (/\/FlateDecode/.test(dict)) data = zlib.inflateSync(data)
    objects.set(m[1], { dict, stream: data })
    header.lastIndex = src.indexOf('endobj', start + length)
  }
  return objects
}

export function parseCMap(text: string): Map<number, string> {
  const map = new Map<number, string>()
  const hexToString = (hex: string) => {
    let s = ''
    for (let i = 0; i < hex.length; i += 4) s += String.fromCharCode(parseInt(hex.slice(i, i + 4), 16))
    return s
  }
  for (const block of text.matchAll(/beginbfchar([\s\S]*?)endbfchar/g)) {
    for (const [, src, dst] of block[1].matchAll(/<([0-9a-fA-F]+)>\s*<([0-9a-fA-F]+)>/g)) map.set(parseInt(src, 16), hexToString(dst))
  }
  for (const block of text.matchAll(/beginbfrange([\s\S]*?)endbfrange/g)) {
    for (const [, lo, hi, rest] of block[1].matchAll(/<([0-9a-fA-F]+)>\s*<([0-9a-fA-F]+)>\s*(\[[^\]]*\]|<[0-9a-fA-F\s]+>)/g)) {
      const a = parseInt(lo, 16)
      const b = parseInt(hi, 16)
      if (rest.startsWith('[')) {
        // Ligatures map one code to several characters: "<0066 0066>" is "ff".
        const items = [...rest.matchAll(/<([0-9a-fA-F\s]*)>/g)].map((x) => x[1].replace(/\s+/g, ''))
        for (let c = a; c <= b; c++) map.set(c, hexToString(items[c - a] ?? ''))
      } else {
        const base = parseInt(rest.slice(1, -1), 16)
        for (let c = a; c <= b; c++) map.set(c, String.fromCharCode(base + c - a))
      }
    }
  }
  return map
}

/** The document's text, one line per text object. */
export function pdfText(pdf: Buffer): string {
  if (pdf.subarray(0, 5).toString('latin1') !== '%PDF-') throw new Error('not a PDF')
  const objects = readObjects(pdf)
  // Font resource names (/F1 …) → the font's ToUnicode map.
  const cmapOfFont = new Map<string, Map<number, string>>()
  for (const [id, obj] of objects) {
    const tu = obj.dict.match(/\/ToUnicode (\d+) 0 R/)
    if (!tu) continue
    const cmap = objects.get(tu[1])?.stream
    if (cmap) cmapOfFont.set(id, parseCMap(cmap.toString('latin1')))
  }
  const byName = new Map<string, Map<number, string>>()
  for (const obj of objects.values()) {
    for (const fontDict of obj.dict.matchAll(/\/Font\s*<<([\s\S]*?)>>/g)) {
      for (const [, name, ref] of fontDict[1].matchAll(/\/([\w.-]+)\s+(\d+) 0 R/g)) {
        const cmap = cmapOfFont.get(ref)
        if (cmap) byName.set(name, cmap)
      }
    }
  }
  const lines: string[] = []
  for (const obj of objects.values()) {
    if (!obj.stream) continue
    const content = obj.stream.toString('latin1')
    if (!/\bBT\b/.test(content)) continue
    let cmap: Map<number, string> | undefined
    for (const block of content.matchAll(/BT([\s\S]*?)ET/g)) {
      let line = ''
      for (const op of block[1].matchAll(/\/([\w.-]+)\s+[\d.]+\s+Tf|\[((?:[^\]])*)\]\s*TJ|<([0-9a-fA-F]*)>\s*Tj/g)) {
        if (op[1]) {
          cmap = byName.get(op[1])
          continue
        }
        const hexes = op[2] !== undefined ? [...op[2].matchAll(/<([0-9a-fA-F]*)>/g)].map((x) => x[1]) : [op[3]]
        for (const hex of hexes) {
          for (let i = 0; i + 4 <= hex.length; i += 4) line += cmap?.get(parseInt(hex.slice(i, i + 4), 16)) ?? ''
        }
      }
      lines.push(line)
    }
  }
  return lines.join('\n')
}

/**
 * What a reader sees on a screen, checked the way the documents are: no enumeration code or engine
 * unit name as text, no machine date (2026-12-02), no library placeholder ("No Data"), and no word
 * broken across two lines ("Pac" / "k") in a table cell or anywhere else.
 */
import type { Page } from 'playwright-core'
import { codesIn } from './pdf-checks'

/** Elements whose text may legitimately break anywhere (tokens, links, code). */
const BREAK_ANYWHERE = 'script, style, code, pre, svg, textarea, [data-break-anywhere]'

/**
 * Words laid out on more than one line. A word is a run of letters and digits between spaces,
 * hyphens and slashes: a break after a hyphen or slash is where people break words too.
 */
export async function splitWords(page: Page): Promise<string[]> {
  return page.evaluate((skip) => {
    const out: string[] = []
    const walker = document.createTreeWalker(document.body, NodeFilter.SHOW_TEXT)
    const range = document.createRange()
    while (walker.nextNode()) {
      const node = walker.currentNode as Text
      const el = node.parentElement
      if (!el || el.closest(skip) || !el.getClientRects().length) continue
      const text = node.textContent ?? ''
      for (const m of text.matchAll(/[^\s\-‐/–—(),;:]+/g)) {
        if (m[0].length < 2) continue
        range.setStart(node, m.index!)
        range.setEnd(node, m.index! + m[0].length)
        const rects = [...range.getClientRects()].filter((r) => r.width > 0 && r.height > 0)
        if (rects.length < 2) continue
        const tops = rects.map((r) => r.top)
        if (Math.max(...tops) - Math.min(...tops) > rects[0].height * 0.5) out.push(`"${m[0]}" in "${text.trim().slice(0, 60)}"`)
      }
    }
    return [...new Set(out)]
  }, BREAK_ANYWHERE)
}

/** Codes, machine dates and library placeholders in the visible text of the page. */
export async function codesOnScreen(page: Page): Promise<string[]> {
  const lines = (await page.evaluate(() => document.body.innerText))
    .split('\n')
    .map((l) => l.trim())
    .filter(Boolean)
  const found = codesIn(lines)
  for (const line of lines) {
    const iso = /\b\d{4}-\d{2}-\d{2}\b/.exec(line)
    if (iso) found.push(`machine date ${iso[0]} in "${line.slice(0, 120)}"`)
    if (/\bNo Data\b/.test(line)) found.push(`library placeholder in "${line.slice(0, 120)}"`)
  }
  return found
}

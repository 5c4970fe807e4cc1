/**
 * One way in for photometric files: IES LM-63 (.ies) or EULUMDAT (.ldt), told apart by their
 * content, read into the same Photometry shape. Errors name the format and the line.
 */
import { looksLikeEulumdat, parseEulumdat } from './eulumdat'
import { parseLm63, type Lm63Error, type Photometry } from './lm63'

export type PhotometricFormat = 'lm63' | 'eulumdat'

export type PhotometricFileResult =
  { ok: true; format: PhotometricFormat; value: Photometry; notes: string[] } | { ok: false; format: PhotometricFormat; error: Lm63Error }

/** Words for each format, for messages. */
export const PHOTOMETRIC_FORMAT_NAMES: Record<PhotometricFormat, string> = { lm63: 'LM-63 file', eulumdat: 'EULUMDAT file' }

export function parsePhotometricFile(text: string): PhotometricFileResult {
  if (looksLikeEulumdat(text)) {
    const r = parseEulumdat(text)
    return r.ok ? { ok: true, format: 'eulumdat', value: r.value, notes: r.value.notes } : { ok: false, format: 'eulumdat', error: r.error }
  }
  const r = parseLm63(text)
  return r.ok ? { ok: true, format: 'lm63', value: r.value, notes: [] } : { ok: false, format: 'lm63', error: r.error }
}

/**
 * JSON text of an object with some fields whose JSON text is already at hand (a jsonb column read
 * as text) set in as they are: a stored sheet's working is sent without being parsed into objects
 * and serialised again.
 */
export function jsonWithRawFields(value: Record<string, unknown>, raw: Record<string, string>): string {
  const head = JSON.stringify(value)
  const tail = Object.entries(raw)
    .map(([key, text]) => `${JSON.stringify(key)}:${text}`)
    .join(',')
  if (!tail) return head
  return head === '{}' ? `{${tail}}` : `${head.slice(0, -1)},${tail}}`
}

/**
 * Where the luminaires of an even row stand on a route: the two end ones `end` from each end,
 * the rest evenly between (one luminaire stands in the middle). The same layout the spacing
 * tool checks point by point; kept apart so a drawing can use it without the solver.
 */
export function evenRowPositions(routeLengthM: number, count: number, endM: number): number[] {
  if (!(count >= 1) || !(routeLengthM > 0)) return []
  if (count === 1) return [routeLengthM / 2]
  const end = Math.min(Math.max(endM, 0), routeLengthM / 2)
  return Array.from({ length: count }, (_, k) => end + (k * (routeLengthM - 2 * end)) / (count - 1))
}

import { RowSolver, requirementFor, rowCriteria } from './shared/engine/spacing'
import { parseLm63 } from './shared/engine/lm63'
import { readFileSync } from 'node:fs'
const p = parseLm63(readFileSync('tests/fixtures/photometry/corridor-wash-2002.ies', 'utf8'))
if (!p.ok) throw 1
const iso = { verticalAngles: [0, 90], horizontalAngles: [0], candela: [[10, 10]] }
for (const [name, table] of [['2002', p.value], ['iso', iso]] as const)
for (const c of ['nfpa101', 'en1838-route'] as const) {
const crit = rowCriteria(c, requirementFor(c), 2)
const acc: Record<string, number> = {}
for (let rep = 0; rep < 5; rep++) for (const h of [2,2.5,3,3.5,4,4.5,5,6,7,8]) {
let t = performance.now()
const lap = (l: string) => { const n = performance.now(); acc[l] = (acc[l] ?? 0) + (n - t) / 5; t = n }
const s = new RowSolver({ table, mountingHeight: h, factor: 0.4, cPlane: 0, criteria: crit })
lap('ctor')
s.minimumBound(); lap('minBound')
const S = s.maxSpacing()!; lap('maxSpacing')
const st = s.statistics(S); lap('stats')
const e = s.endDistance(S, st.max); lap('end')
s.luminairesFor(30, S, e); lap('count')
}
console.log(name, c, JSON.stringify(Object.fromEntries(Object.entries(acc).map(([k, v]) => [k, v.toFixed(1)]))))
}

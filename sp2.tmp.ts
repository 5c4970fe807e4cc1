import { computeSpacing, spacingInput } from './shared/engine/spacing'
import { readFileSync } from 'node:fs'
const table = { verticalAngles: [0, 90], horizontalAngles: [0], candela: [[10, 10]] }
for (const photometry of [table, readFileSync('tests/fixtures/photometry/corridor-wash-2002.ies', 'utf8'), readFileSync('tests/fixtures/photometry/open-area-2019.ies', 'utf8')])
for (const criteria of ['en1838-route', 'nfpa101', 'en1838-open-area']) for (const routeLength of [undefined, 30]) {
const input = spacingInput.parse({ photometry, mountingHeight: 2.5, emergencyOutputFactor: 0.5, criteria, routeWidth: 2, heights: [2,2.5,3,3.5,4,4.5,5,6,7,8], routeLength })
const times = []
for (let k = 0; k < 5; k++) { const t0 = performance.now(); const r = computeSpacing(input); times.push((performance.now() - t0).toFixed(1)); if (k==0) console.log(criteria, routeLength, r.maxSpacingM, r.maxEndSpacingM, r.minIlluminanceLx, r.averageIlluminanceLx, r.luminairesNeeded, r.spacingTable.map(x=>x.maxSpacingM).join(' ')) }
console.log('  ms', times.join(' '))
}

/** `npm run db:seed`: loads the demo workspace (idempotent). */
import { dataSource } from '../data-source'
import { seedDemo } from '../demo/index'

await dataSource.initialize()
await seedDemo(dataSource)
await dataSource.destroy()
console.log('[lampwright] demo workspace ready')

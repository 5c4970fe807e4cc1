// `npm run fuzz`: the bad-input fuzz test with 12,000 generated requests on a throwaway database.
import { spawnSync } from 'node:child_process'
const r = spawnSync('node', ['scripts/test-quick.mjs', '--project', 'server', 'tests/server/fuzz.test.ts'], {
  stdio: 'inherit',
  env: { ...process.env, FUZZ_REQUESTS: process.env.FUZZ_REQUESTS ?? '12000', FUZZ_SEED: process.env.FUZZ_SEED ?? String(Date.now() % 1e9) },
})
process.exit(r.status ?? 1)

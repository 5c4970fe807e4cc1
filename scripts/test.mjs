// `npm test`: set up a throwaway PostgreSQL cluster, type-check, lint, build, run every vitest
// suite (unit, API, browser end-to-end), stop the cluster, and print "N passed, M failed".
import { spawnSync } from 'node:child_process'
import fs from 'node:fs'
import os from 'node:os'
import path from 'node:path'
import { ROOT, ensureChromium, ensureNodeModules, ensurePostgresBinaries, findFreePort, log, startCluster } from './lib/setup.mjs'

const extraArgs = process.argv.slice(2)
let passed = 0
let failed = 0
let cluster = null
const workDir = fs.mkdtempSync(path.join(os.tmpdir(), 'lampwright-test-'))

function step(name, cmd, args, env) {
  log(`${name}…`)
  const r = spawnSync(cmd, args, { cwd: ROOT, stdio: 'inherit', env })
  const ok = r.status === 0
  log(`${name}: ${ok ? 'ok' : 'FAILED'}`)
  return ok
}

function cleanup() {
  try {
    cluster?.stop()
  } catch (err) {
    console.error(`[lampwright] could not stop the test cluster: ${err.message}`)
  }
  cluster = null
  fs.rmSync(workDir, { recursive: true, force: true })
}

process.on('SIGINT', () => {
  cleanup()
  process.exit(130)
})

try {
  ensureNodeModules()
  const bin = ensurePostgresBinaries()
  ensureChromium()
  const port = await findFreePort(Number(process.env.TEST_PG_PORT ?? 54330))
  // The cluster lives in a fresh temporary folder: it never touches the data of `npm start`.
  fs.chmodSync(workDir, 0o755)
  cluster = startCluster({ bin, dir: path.join(workDir, 'pg'), port, database: 'lampwright_test' })
  const env = {
    ...process.env,
    NODE_ENV: 'test',
    DATABASE_URL: cluster.url,
    DATA_DIR: path.join(workDir, 'data'),
    SMTP_CATCHER_PORT: '0',
    LOG_LEVEL: 'silent',
    PORT: '0',
  }
  delete env.SMTP_URL
  delete env.APP_ORIGIN

  if (!step('migrations', 'node', ['--import', 'tsx', 'server/scripts/migrate.ts'], env)) failed++
  // The example jobs are type-checked against the API as it is now: regenerate their client's types first.
  if (!step('API client types (openapi-typescript)', 'node', ['--import', 'tsx', 'scripts/api-types.ts'], env)) failed++
  if (
    step('type check (vue-tsc)', 'npx', ['vue-tsc', '--noEmit', '-p', 'tsconfig.json'], env) &&
    step('engine purity (tsc, no DOM, no Node)', 'npx', ['tsc', '--noEmit', '-p', 'tsconfig.shared.json'], env)
  )
    passed++
  else failed++
  if (step('lint (eslint)', 'npx', ['eslint', '.'], env)) passed++
  else failed++
  if (step('import cycles (dpdm over server/ and shared/)', 'npm', ['run', '-s', 'check:cycles'], env)) passed++
  else failed++
  if (!step('client build (vite)', 'npx', ['vite', 'build', '--logLevel', 'warn'], env)) failed++

  const report = path.join(workDir, 'vitest.json')
  step('tests (vitest)', 'npx', ['vitest', 'run', '--coverage', '--reporter=default', '--reporter=json', `--outputFile.json=${report}`, ...extraArgs], env)
  if (fs.existsSync(report)) {
    const r = JSON.parse(fs.readFileSync(report, 'utf8'))
    passed += r.numPassedTests
    failed += r.numFailedTests
    // A suite that failed to load has no failed tests of its own but must still count.
    failed += (r.testResults ?? []).filter((s) => s.status === 'failed' && (s.assertionResults ?? []).every((a) => a.status !== 'failed')).length
  } else {
    failed++
  }
} catch (err) {
  console.error(`[lampwright] ${err.stack ?? err}`)
  failed++
} finally {
  cleanup()
}

console.log(`${passed} passed, ${failed} failed`)
process.exit(failed === 0 ? 0 : 1)

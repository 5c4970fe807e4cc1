/**
 * `npm run -s calc -- <tool> [file]`: reads the tool's JSON input from the file or standard input,
 * prints the result as JSON. Bad input prints the field errors and exits 2.
 */
import fs from 'node:fs'
import { isToolName, tools } from '../shared/engine/registry'
import { runTool } from '../shared/engine/tool'
import { ENGINE_VERSION } from '../shared/engine/version'

function usage(): never {
  process.stderr.write(`usage: npm run -s calc -- <tool> [input.json]\ntools: ${Object.keys(tools).join(', ')}\n`)
  process.exit(2)
}

const [name, file] = process.argv.slice(2)
if (!name) usage()
const tool = isToolName(name) ? tools[name] : undefined
if (!tool) {
  process.stderr.write(`unknown tool "${name}"\n`)
  usage()
}

let text: string
try {
  text = file && file !== '-' ? fs.readFileSync(file, 'utf8') : fs.readFileSync(0, 'utf8')
} catch (err) {
  process.stderr.write(`cannot read input: ${(err as Error).message}\n`)
  process.exit(2)
}

let input: unknown
try {
  input = JSON.parse(text)
} catch (err) {
  process.stdout.write(JSON.stringify({ error: 'input is not valid JSON', detail: (err as Error).message }, null, 2) + '\n')
  process.exit(2)
}

const outcome = runTool(tool, input)
if (!outcome.ok) {
  process.stdout.write(JSON.stringify({ error: `invalid input for ${name}`, fields: outcome.fields }, null, 2) + '\n')
  process.exit(2)
}
process.stdout.write(JSON.stringify({ tool: name, engineVersion: ENGINE_VERSION, ...outcome.result }, null, 2) + '\n')

// Writes the hard nesting instances (scripts/lib/hard-instances.ts, fixed seeds) as JSON files in
// scripts/fixtures/hard-binpacking/, in the format of ../shared/benchmarks/binpacking.
//   npm run bench:nesting:instances                 writes the files (keeps best counts already proven)
//   npm run bench:nesting:instances -- --prove 60   also runs the engine up to 60 s on every instance whose
//                                                   best count is not known, and records it when proven
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs'
import { dirname, join, resolve } from 'node:path'
import { fileURLToPath } from 'node:url'
import { nest } from '@kitwright/shared/domain/nesting/index'
import { hardSet, type HardInstance } from './lib/hard-instances'

const root = resolve(dirname(fileURLToPath(import.meta.url)), '..')
const folder = join(root, 'scripts', 'fixtures', 'hard-binpacking')
const proveAt = process.argv.indexOf('--prove')
const proveSeconds = proveAt >= 0 ? Number(process.argv[proveAt + 1] ?? '60') : 0

mkdirSync(folder, { recursive: true })
const index: Omit<HardInstance, 'items' | 'source'>[] = []
for (const inst of hardSet()) {
  const file = join(folder, `${inst.name}.json`)
  if (existsSync(file)) {
    const old = JSON.parse(readFileSync(file, 'utf8')) as HardInstance
    if (old.items.join(',') === inst.items.join(',') && old.best_known !== null && inst.best_known === null) {
      inst.best_known = old.best_known
      inst.best_known_status = old.best_known_status
    }
  }
  if (inst.best_known === null && proveSeconds > 0) {
    const demand = new Map<number, number>()
    for (const x of inst.items) demand.set(x, (demand.get(x) ?? 0) + 1)
    const plan = await nest(
      { pieces: [...demand].map(([length, quantity]) => ({ length, quantity })), stock: [{ length: inst.capacity }] },
      { timeLimitMs: proveSeconds * 1000 },
    )
    if (plan.status === 'optimal') {
      inst.best_known = plan.sticks.length
      inst.best_known_status = `optimum proven by Kitwright's engine (${plan.sticks.length} sticks = its lower bound, ${plan.bounds.source} bound), ${new Date().toISOString().slice(0, 10)}`
    }
    console.log(`${inst.name}: ${plan.sticks.length} sticks, bound ${plan.bounds.sticks} (${plan.bounds.source}), ${plan.seconds.toFixed(2)} s`)
  }
  writeFileSync(file, `${JSON.stringify(inst)}\n`)
  const { items: _items, source: _source, ...entry } = inst
  index.push(entry)
}
writeFileSync(join(folder, 'index.json'), `[\n${index.map((e) => JSON.stringify({ file: `${e.name}.json`, ...e })).join(',\n')}\n]\n`)
console.log(`${index.length} instances in ${folder}`)

// Benchmark of Kitwright's nesting engine (npm run bench:nesting).
// 1. Per class, the published instances in ../shared/benchmarks/binpacking (the regression set,
//    relative to the repo root) and the hard instances made from fixed seeds in
//    scripts/fixtures/hard-binpacking (npm run bench:nesting:instances): share at the best
//    known / proven stick count, mean and worst seconds, patterns per plan, our sticks ÷ first-fit
//    decreasing sticks, and counts that do not depend on the machine's load (LP iterations).
// 2. A shop batch from our demo grow-tote scenario: 500 units, 7 distinct cut lengths,
//    1/8 in kerf, 10 ft sticks, lengths in the app's base unit; checked against the LP bound rounded up.
// Options: --limit S (time limit per plan in seconds, default 2 — the shop default), --only
// published|hard|batch, --class TEXT (classes whose name contains it), --verbose (one line per instance).
import { existsSync, readFileSync } from 'node:fs'
import { availableParallelism, loadavg } from 'node:os'
import { dirname, join, resolve } from 'node:path'
import { fileURLToPath } from 'node:url'
import { firstFitDecreasing, nest } from '@kitwright/shared/domain/nesting/index'
import type { NestPlan } from '@kitwright/shared/domain/nesting/index'
import { inches } from '@kitwright/shared/domain/units'

const root = resolve(dirname(fileURLToPath(import.meta.url)), '..')
const published = join(root, '..', 'shared', 'benchmarks', 'binpacking')
const hard = join(root, 'scripts', 'fixtures', 'hard-binpacking')
const arg = (name: string): string | undefined => {
  const i = process.argv.indexOf(name)
  return i >= 0 ? process.argv[i + 1] : undefined
}
const limitSeconds = Number(arg('--limit') ?? '2')
const only = arg('--only')
const classFilter = arg('--class')
const verbose = process.argv.includes('--verbose')

interface IndexEntry {
  file: string
  name: string
  capacity: number
  best_known: number | null
}
interface Row {
  name: string
  sticks: number
  best: number | null
  bound: number
  proven: boolean
  seconds: number
  cpuSeconds: number
  patterns: number
  ffd: number
  lpIterations: number
  valid: boolean
}

function checkPlan(plan: NestPlan, items: number[], capacity: number): string | null {
  const want = new Map<number, number>()
  for (const x of items) want.set(x, (want.get(x) ?? 0) + 1)
  for (const s of plan.sticks) {
    if (s.cuts.reduce((a, c) => a + c.length, 0) > capacity) return 'stick over length'
    for (const c of s.cuts) {
      const n = want.get(c.length) ?? 0
      if (n === 0) return `extra piece ${c.length}`
      want.set(c.length, n - 1)
    }
  }
  for (const [len, n] of want) if (n !== 0) return `${n} piece(s) of ${len} not cut`
  return null
}

const pad = (s: string | number, n: number): string => String(s).padStart(n)

/** Class of a file: its folder for the published set, its name's prefix for the hard set. */
function classOf(setName: string, entry: IndexEntry): string {
  if (setName === 'published') return entry.file.split('/')[0] ?? entry.file
  return entry.name.replace(/_s\d+$/, '').replace(/_n\d+$/, '')
}

async function benchSet(setName: string, folder: string): Promise<{ atBest: number; total: number; invalid: string[] }> {
  if (!existsSync(join(folder, 'index.json'))) {
    console.log(`${setName}: no index.json in ${folder}: skipped${setName === 'hard' ? ' (npm run bench:nesting:instances makes it)' : ''}.`)
    return { atBest: 0, total: 0, invalid: [] }
  }
  const index = JSON.parse(readFileSync(join(folder, 'index.json'), 'utf8')) as IndexEntry[]
  const byClass = new Map<string, Row[]>()
  const invalid: string[] = []
  for (const entry of index) {
    const cls = classOf(setName, entry)
    if (classFilter && !cls.includes(classFilter)) continue
    const inst = JSON.parse(readFileSync(join(folder, entry.file), 'utf8')) as { items: number[]; capacity: number }
    const demand = new Map<number, number>()
    for (const x of inst.items) demand.set(x, (demand.get(x) ?? 0) + 1)
    const t0 = performance.now()
    const cpu0 = process.cpuUsage()
    const plan = await nest(
      { pieces: [...demand].map(([length, quantity]) => ({ length, quantity })), stock: [{ length: inst.capacity }] },
      { timeLimitMs: limitSeconds * 1000 },
    )
    const seconds = (performance.now() - t0) / 1000
    const used = process.cpuUsage(cpu0)
    const cpuSeconds = (used.user + used.system) / 1e6
    const why = checkPlan(plan, inst.items, inst.capacity)
    if (why) invalid.push(`${entry.name}: ${why}`)
    const row: Row = {
      name: entry.name,
      sticks: plan.sticks.length,
      best: entry.best_known,
      bound: plan.bounds.sticks,
      proven: plan.status === 'optimal',
      seconds,
      cpuSeconds,
      patterns: plan.patterns.length,
      ffd: firstFitDecreasing(inst.items, inst.capacity).length,
      lpIterations: plan.stats?.lpIterations ?? 0,
      valid: why === null,
    }
    const rows = byClass.get(cls) ?? []
    rows.push(row)
    byClass.set(cls, rows)
    if (verbose) {
      console.log(
        `  ${row.name.padEnd(24)} sticks ${pad(row.sticks, 4)} best ${pad(row.best ?? '?', 4)} bound ${pad(row.bound, 4)} (${plan.bounds.source ?? '?'}) ` +
          `patterns ${pad(row.patterns, 4)} FFD ${pad(row.ffd, 4)} LP iterations ${pad(row.lpIterations, 4)} ${seconds.toFixed(3)} s (cpu ${cpuSeconds.toFixed(3)} s) ${plan.status}`,
      )
    }
  }
  console.log(
    `${setName.padEnd(10)}${'class'.padEnd(18)}${pad('n', 4)}${pad('at best', 9)}${pad('proven', 8)}${pad('mean s', 8)}${pad('worst s', 9)}${pad('cpu mean', 10)}${pad('cpu worst', 11)}` +
      `${pad('patterns', 10)}${pad('sticks', 8)}${pad('÷ FFD', 8)}${pad('LP iter', 9)}`,
  )
  let atBest = 0
  let total = 0
  for (const [cls, rows] of byClass) {
    const best = rows.filter((r) => r.valid && r.sticks <= (r.best ?? r.bound)).length
    const proven = rows.filter((r) => r.valid && r.proven).length
    const mean = rows.reduce((a, r) => a + r.seconds, 0) / rows.length
    const worst = Math.max(...rows.map((r) => r.seconds))
    const cpuMean = rows.reduce((a, r) => a + r.cpuSeconds, 0) / rows.length
    const cpuWorst = Math.max(...rows.map((r) => r.cpuSeconds))
    const patterns = rows.reduce((a, r) => a + r.patterns, 0) / rows.length
    const sticks = rows.reduce((a, r) => a + r.sticks, 0)
    const ffd = rows.reduce((a, r) => a + r.ffd, 0)
    const iters = rows.reduce((a, r) => a + r.lpIterations, 0)
    atBest += best
    total += rows.length
    console.log(
      `${''.padEnd(10)}${cls.padEnd(18)}${pad(rows.length, 4)}${pad(`${best}/${rows.length}`, 9)}${pad(`${proven}/${rows.length}`, 8)}` +
        `${pad(mean.toFixed(3), 8)}${pad(worst.toFixed(3), 9)}${pad(cpuMean.toFixed(3), 10)}${pad(cpuWorst.toFixed(3), 11)}${pad(patterns.toFixed(1), 10)}${pad(sticks, 8)}${pad((sticks / ffd).toFixed(4), 8)}${pad(iters, 9)}`,
    )
  }
  console.log(
    `${setName}: ${atBest}/${total} at the best known (or proven) count, invalid plans: ${invalid.length}${invalid.length ? ` (${invalid.join('; ')})` : ''}`,
  )
  console.log('')
  return { atBest, total, invalid }
}

async function benchShopBatch(): Promise<void> {
  // Invented demo scenario: one grow-tote frame per unit, cut from 10 ft PVC sticks.
  // Lengths in the app's base unit (shared/src/domain/units.ts), as the server would pass them.
  const units = 500
  const perUnit = [
    { length: inches(22.25), quantity: 2, cutPartRef: 'long rail' },
    { length: inches(15.75), quantity: 2, cutPartRef: 'short rail' },
    { length: inches(11.5), quantity: 1, cutPartRef: 'manifold spine' },
    { length: inches(9.625), quantity: 2, cutPartRef: 'riser' },
    { length: inches(6.375), quantity: 1, cutPartRef: 'drain leg' },
    { length: inches(3.125), quantity: 4, cutPartRef: 'sprayer stub' },
    { length: inches(2.5), quantity: 2, cutPartRef: 'coupling spacer' },
  ]
  const pieces = perUnit.map((p) => ({ ...p, quantity: p.quantity * units }))
  const t0 = performance.now()
  const plan = await nest({ pieces, stock: [{ id: '10ft', length: inches(120) }], kerf: inches(1 / 8) }, { timeLimitMs: limitSeconds * 1000 })
  const seconds = (performance.now() - t0) / 1000
  const lp = plan.bounds.lpCost
  const lpSticks = lp === null ? null : Math.ceil(lp / inches(120) - 1e-9)
  console.log(`shop batch: ${units} units x ${perUnit.length} lengths (${pieces.reduce((s, p) => s + p.quantity, 0)} pieces), 1/8 in kerf, 10 ft sticks`)
  console.log(
    `  sticks ${plan.sticks.length}, ceil(LP bound) ${lpSticks ?? 'n/a (LP not needed: a simpler bound was met)'}, proven bound ${plan.bounds.sticks}, ` +
      `patterns ${plan.patterns.length}, waste ${plan.totals.wastePercent.toFixed(2)}%, seconds ${seconds.toFixed(3)}`,
  )
  const hit = plan.sticks.length <= (lpSticks ?? plan.bounds.sticks)
  console.log(`  at ceil(LP bound): ${hit ? 'yes' : 'no'}; within 1 s: ${seconds <= 1 ? 'yes' : 'no'}`)
}

console.log(`time limit ${limitSeconds} s per plan; ${availableParallelism()} cores; load average ${loadavg()[0]?.toFixed(1)} at the start`)
console.log('')
if (!only || only === 'published') await benchSet('published', published)
if (!only || only === 'hard') await benchSet('hard', hard)
if (!only || only === 'batch') await benchShopBatch()
console.log(`load average ${loadavg()[0]?.toFixed(1)} at the end`)

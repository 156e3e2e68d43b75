// Benchmark of Kitwright's nesting engine (npm run bench:nesting).
// 1. Every published instance in ../shared/benchmarks/binpacking (relative to the repo root):
//    sticks used, best known, Martello–Toth L2, first-fit decreasing, seconds; then a summary.
// 2. A shop batch from our demo grow-tote scenario: 500 units, 7 distinct cut lengths,
//    1/8 in kerf, 10 ft sticks, lengths in the app's base unit; checked against the LP bound rounded up.
import { existsSync, readFileSync } from 'node:fs'
import { dirname, join, resolve } from 'node:path'
import { fileURLToPath } from 'node:url'
import { firstFitDecreasing, martelloTothL2, nest } from '@kitwright/shared/domain/nesting/index'
import type { NestPlan } from '@kitwright/shared/domain/nesting/index'
import { inches } from '@kitwright/shared/domain/units'

const root = resolve(dirname(fileURLToPath(import.meta.url)), '..')
const folder = join(root, '..', 'shared', 'benchmarks', 'binpacking')

interface IndexEntry {
  file: string
  name: string
  capacity: number
  best_known: number
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

async function benchInstances(): Promise<void> {
  if (!existsSync(join(folder, 'index.json'))) {
    console.log(`Benchmark folder not found at ${folder}: skipping the published instances.`)
    return
  }
  const index = JSON.parse(readFileSync(join(folder, 'index.json'), 'utf8')) as IndexEntry[]
  console.log(`${'instance'.padEnd(26)}${pad('sticks', 8)}${pad('best', 7)}${pad('L2', 6)}${pad('FFD', 6)}${pad('seconds', 9)}`)
  let atBest = 0
  let ours = 0
  let ffdTotal = 0
  const times: number[] = []
  const invalid: string[] = []
  for (const entry of index) {
    const inst = JSON.parse(readFileSync(join(folder, entry.file), 'utf8')) as { items: number[]; capacity: number }
    const demand = new Map<number, number>()
    for (const x of inst.items) demand.set(x, (demand.get(x) ?? 0) + 1)
    const t0 = performance.now()
    const plan = await nest({ pieces: [...demand].map(([length, quantity]) => ({ length, quantity })), stock: [{ length: inst.capacity }] })
    const seconds = (performance.now() - t0) / 1000
    const why = checkPlan(plan, inst.items, inst.capacity)
    if (why) invalid.push(`${entry.name}: ${why}`)
    const sticks = plan.sticks.length
    const l2 = martelloTothL2(inst.items, inst.capacity)
    const ffd = firstFitDecreasing(inst.items, inst.capacity).length
    if (!why && sticks <= entry.best_known) atBest++
    ours += sticks
    ffdTotal += ffd
    times.push(seconds)
    const mark = sticks <= entry.best_known ? '' : '  above best known'
    console.log(`${entry.name.padEnd(26)}${pad(sticks, 8)}${pad(entry.best_known, 7)}${pad(l2, 6)}${pad(ffd, 6)}${pad(seconds.toFixed(3), 9)}${mark}`)
  }
  const mean = times.reduce((a, b) => a + b, 0) / Math.max(1, times.length)
  const worst = Math.max(0, ...times)
  console.log('')
  console.log(`at best known: ${atBest}/${index.length}`)
  console.log(`invalid plans: ${invalid.length}${invalid.length ? ` (${invalid.join('; ')})` : ''}`)
  console.log(`seconds: mean ${mean.toFixed(3)}, worst ${worst.toFixed(3)}`)
  console.log(`sticks: ours ${ours} / FFD ${ffdTotal} = ${(ours / ffdTotal).toFixed(4)}`)
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
  const plan = await nest({ pieces, stock: [{ id: '10ft', length: inches(120) }], kerf: inches(1 / 8) })
  const seconds = (performance.now() - t0) / 1000
  const lp = plan.bounds.lpCost
  const lpSticks = lp === null ? null : Math.ceil(lp / inches(120) - 1e-9)
  console.log('')
  console.log(`shop batch: ${units} units x ${perUnit.length} lengths (${pieces.reduce((s, p) => s + p.quantity, 0)} pieces), 1/8 in kerf, 10 ft sticks`)
  console.log(
    `  sticks ${plan.sticks.length}, ceil(LP bound) ${lpSticks ?? 'n/a (LP not needed: a simpler bound was met)'}, proven bound ${plan.bounds.sticks}, ` +
      `patterns ${plan.patterns.length}, waste ${plan.totals.wastePercent.toFixed(2)}%, seconds ${seconds.toFixed(3)}`,
  )
  const hit = plan.sticks.length <= (lpSticks ?? plan.bounds.sticks)
  console.log(`  at ceil(LP bound): ${hit ? 'yes' : 'no'}; within 1 s: ${seconds <= 1 ? 'yes' : 'no'}`)
}

await benchInstances()
await benchShopBatch()

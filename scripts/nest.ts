// Kitwright nesting engine on one benchmark instance (JSON format of
// ../shared/benchmarks/binpacking/README.md). Prints exactly one JSON object on stdout:
// { "sticks": [ { "length": L, "cuts": [...] } ], "lowerBound": n, "seconds": s }
// Kerf and end trim are 0 unless the file gives `kerf` / `end_trim` (or `trim`).
import { readFileSync } from 'node:fs'
import { nest } from '@kitwright/shared/domain/nesting/index'

interface Instance {
  capacity: number
  items: number[]
  kerf?: number
  end_trim?: number
  trim?: number
}

function parseInstance(text: string, file: string): Instance {
  const raw: unknown = JSON.parse(text)
  if (typeof raw !== 'object' || raw === null) throw new Error(`${file}: not a JSON object`)
  const o = raw as Record<string, unknown>
  const capacity = o['capacity']
  const items = o['items']
  if (typeof capacity !== 'number' || !Array.isArray(items) || !items.every((x) => typeof x === 'number')) {
    throw new Error(`${file}: needs "capacity" (number) and "items" (array of numbers)`)
  }
  const num = (k: string): number | undefined => (typeof o[k] === 'number' ? (o[k] as number) : undefined)
  const inst: Instance = { capacity, items: items as number[] }
  const kerf = num('kerf')
  const endTrim = num('end_trim') ?? num('trim')
  if (kerf !== undefined) inst.kerf = kerf
  if (endTrim !== undefined) inst.end_trim = endTrim
  return inst
}

async function main(): Promise<void> {
  const file = process.argv[2]
  if (!file) {
    process.stderr.write('usage: npm run --silent nest -- FILE.json\n')
    process.exit(2)
  }
  const inst = parseInstance(readFileSync(file, 'utf8'), file)
  const demand = new Map<number, number>()
  for (const x of inst.items) demand.set(x, (demand.get(x) ?? 0) + 1)
  const started = performance.now()
  const plan = await nest({
    pieces: [...demand].map(([length, quantity]) => ({ length, quantity })),
    stock: [{ length: inst.capacity }],
    kerf: inst.kerf ?? 0,
    endTrim: inst.end_trim ?? 0,
  })
  const seconds = (performance.now() - started) / 1000
  const out = {
    sticks: plan.sticks.map((s) => ({ length: s.length, cuts: s.cuts.map((c) => c.length) })),
    lowerBound: plan.bounds.sticks,
    seconds: Math.round(seconds * 1000) / 1000,
  }
  process.stdout.write(`${JSON.stringify(out)}\n`)
}

main().catch((err: unknown) => {
  process.stderr.write(`${err instanceof Error ? err.message : String(err)}\n`)
  process.exit(1)
})

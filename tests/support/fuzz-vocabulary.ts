import { readdirSync } from 'node:fs'
import path from 'node:path'

/** What the API's own contracts know: the key set of every object schema, and every enum and literal value. */
export interface Vocabulary {
  shapes: string[][]
  keys: string[]
  words: string[]
}

interface ZodLike {
  _zod: { def: Record<string, unknown> & { type: string } }
}
const isZod = (v: unknown): v is ZodLike => typeof v === 'object' && v !== null && '_zod' in v

/** Walks one zod (v4) schema, collecting object key sets and enum/literal values. */
function walk(schema: ZodLike, into: { shapes: string[][]; words: Set<string> }, seen: Set<unknown>) {
  if (seen.has(schema)) return
  seen.add(schema)
  const def = schema._zod.def
  const visit = (v: unknown) => {
    if (isZod(v)) walk(v, into, seen)
  }
  switch (def.type) {
    case 'object': {
      const shape = def.shape as Record<string, unknown>
      into.shapes.push(Object.keys(shape))
      Object.values(shape).forEach(visit)
      break
    }
    case 'enum':
      for (const v of Object.values(def.entries as Record<string, unknown>)) if (typeof v === 'string') into.words.add(v)
      break
    case 'literal':
      for (const v of def.values as unknown[]) if (typeof v === 'string') into.words.add(v)
      break
    case 'array':
      visit(def.element)
      break
    case 'union':
      ;(def.options as unknown[]).forEach(visit)
      break
    case 'intersection':
      visit(def.left)
      visit(def.right)
      break
    case 'pipe':
      visit(def.in)
      visit(def.out)
      break
    case 'record':
      visit(def.valueType)
      break
    case 'tuple':
      ;(def.items as unknown[]).forEach(visit)
      break
    default:
      visit(def.innerType)
  }
}

/** Reads every contract module of shared/src (not the tests, not the pure domain code). */
export async function loadVocabulary(): Promise<Vocabulary> {
  const dir = path.resolve(import.meta.dirname, '../../shared/src')
  const into = { shapes: [] as string[][], words: new Set<string>() }
  const seen = new Set<unknown>()
  for (const file of readdirSync(dir).filter((f) => f.endsWith('.ts') && !f.endsWith('.test.ts'))) {
    const mod = (await import(path.join(dir, file))) as Record<string, unknown>
    for (const value of Object.values(mod)) if (isZod(value)) walk(value, into, seen)
  }
  const shapes = into.shapes.filter((s) => s.length > 0)
  return { shapes, keys: [...new Set(shapes.flat())].sort(), words: [...into.words].sort() }
}

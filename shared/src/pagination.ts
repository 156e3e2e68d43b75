import { z } from 'zod'

/** Page sizes a list offers; the API refuses others so caches and links stay few and predictable. */
export const PAGE_SIZES = [10, 25, 50, 100] as const

/** One page of a server-paginated list: the items, how many match in all, and where the page is. */
export function PageOf<T extends z.ZodType>(item: T) {
  return z.object({
    items: z.array(item),
    total: z.number().int().min(0),
    page: z.number().int().min(1),
    pageSize: z.number().int().min(1),
  })
}
/** One page of a server-paginated list. */
export type Page<T> = { items: T[]; total: number; page: number; pageSize: number }

/** Which way a list is sorted. */
export const SortDirSchema = z.enum(['asc', 'desc'])
/** Which way a list is sorted. */
export type SortDir = z.infer<typeof SortDirSchema>

/** The 1-based page number of a list query (query strings arrive as text). */
export const PageNumberSchema = z.coerce.number().int('Use a whole page number').min(1, 'Pages start at 1').default(1)

/** The page size of a list query: one of {@link PAGE_SIZES}. */
export const PageSizeSchema = z.coerce
  .number()
  .refine((n) => (PAGE_SIZES as readonly number[]).includes(n), `Use a page size of ${PAGE_SIZES.join(', ')}`)
  .default(25)

/** The number of pages needed for `total` items (at least 1, so "page 1 of 1" reads right when empty). */
export function pageCount(total: number, pageSize: number): number {
  return Math.max(1, Math.ceil(total / pageSize))
}

/**
 * Reads a list query from a URL's search params the forgiving way: each field that is missing or
 * malformed falls back to its default (or is dropped), so a hand-edited or stale link still opens a
 * page. The API parses the same schema strictly and answers 400 instead.
 */
export function querySearchWithDefaults<S extends z.ZodObject>(schema: S, search: { get(key: string): string | null }): z.infer<S> {
  const out: Record<string, unknown> = {}
  for (const [key, field] of Object.entries(schema.shape as Record<string, z.ZodType>)) {
    const raw = search.get(key) ?? undefined
    const parsed = field.safeParse(raw)
    const value = parsed.success ? parsed.data : field.safeParse(undefined).data
    if (value !== undefined) out[key] = value
  }
  return schema.parse(out)
}

/** A list query as search-param pairs (for `new URLSearchParams(…)`), leaving out the schema's defaults. */
export function queryToSearch<S extends z.ZodObject>(schema: S, query: z.infer<S>): Record<string, string> {
  const defaults: Record<string, unknown> = schema.parse({})
  const search: Record<string, string> = {}
  for (const [key, value] of Object.entries(query as Record<string, unknown>)) {
    if (value === undefined || value === null || value === '' || value === defaults[key]) continue
    search[key] = String(value)
  }
  return search
}

import fc from 'fast-check'
import type { Vocabulary } from './fuzz-vocabulary'

/** Values real rows hold (ids, serials, bin codes, SKUs, order numbers), so fuzzed requests reach the services. */
export interface KnownValues {
  ids: string[]
  codes: string[]
}

/** Cells and strings that broke programs before: blanks, huge, formulas, NUL, paths, quotes, odd numbers. */
const NASTY = [
  '', ' ', '0', '-1', '1e309', '-0', '9007199254740993', 'NaN', 'true', 'null', '[]', '{}',
  '4-1/4"', '108 mm', '10 ft; 20 ft', '1/0', '0.000000001 in', '$12.34', '2026-02-30', '2026-13-01T25:61:00Z',
  '=HYPERLINK("http://x","y")', '+1+1', '@SUM(A1)', '\t=1', '\u0000', '\ud800', 'é\u0301', '🙂'.repeat(40),
  '../../etc/passwd', "' or 1=1 --", '%', '_', '\\', 'x'.repeat(5000), 'a,b\n"c', '<script>x</script>',
]

export function fuzzArbitraries(vocab: Vocabulary, known: KnownValues) {
  const word = fc.constantFrom(...vocab.words)
  const scalar = fc.oneof(
    fc.string({ maxLength: 20 }),
    fc.string({ unit: 'grapheme', maxLength: 20 }),
    word,
    fc.constantFrom(...NASTY),
    fc.integer(),
    fc.integer({ min: -2, max: 200 }),
    fc.double(),
    fc.boolean(),
    fc.constant(null),
    fc.constantFrom(...known.ids),
    fc.constantFrom(...known.codes),
    fc.uuid(),
    fc.date({ noInvalidDate: true, min: new Date('1900-01-01'), max: new Date('2200-01-01') }).map((d) => d.toISOString()),
  )
  const { value, object } = fc.letrec<{ value: unknown; object: Record<string, unknown> }>((tie) => ({
    value: fc.oneof({ depthSize: 'small', maxDepth: 3 }, scalar, scalar, fc.array(tie('value'), { maxLength: 4 }), tie('object')),
    // An object shaped like one of the contracts, with any subset of its keys and any values.
    object: fc.oneof(
      { maxDepth: 3 },
      fc.constantFrom(...vocab.shapes).chain((keys) => fc.record(Object.fromEntries(keys.map((k) => [k, tie('value')])), { requiredKeys: [] })),
      fc.dictionary(fc.oneof(fc.constantFrom(...vocab.keys), fc.string({ maxLength: 8 })), tie('value'), { maxKeys: 5 }),
    ),
  }))
  const text = scalar.map((v) => (v === null ? '' : String(v)))
  return {
    /** A JSON body: mostly contract-shaped objects, sometimes any JSON at all. */
    body: fc.oneof({ weight: 8, arbitrary: object }, { weight: 1, arbitrary: fc.jsonValue() }, { weight: 1, arbitrary: fc.array(value, { maxLength: 3 }) }),
    /** Bytes that are not the JSON they claim to be. */
    rawBody: fc.oneof(fc.constantFrom('{', '[1,', '{"a":}', 'null', '"text"', '\u0000', '{"__proto__":{"x":1}}', '{"constructor":{"prototype":{"x":1}}}'), fc.string({ maxLength: 40 })),
    /** A query string: contract keys and paging words with strings, sometimes repeated keys. */
    query: fc.dictionary(
      fc.oneof(fc.constantFrom(...vocab.keys), fc.constantFrom('page', 'pageSize', 'sort', 'dir', 'q', 'status', 'from', 'to', 'kind', 'active', 'code', 'format'), fc.string({ maxLength: 6 })),
      fc.oneof({ weight: 4, arbitrary: text }, { weight: 1, arbitrary: fc.array(text, { minLength: 2, maxLength: 3 }) }),
      { maxKeys: 4 },
    ),
    /** A path parameter: a real id or code, a random uuid, or any string. */
    param: fc.oneof(fc.constantFrom(...known.ids), fc.constantFrom(...known.codes), fc.uuid(), fc.string({ minLength: 1, maxLength: 30 }), fc.constantFrom(...NASTY.filter((s) => s !== ''))),
  }
}

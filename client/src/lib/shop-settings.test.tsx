// @vitest-environment happy-dom
import { QueryClient, QueryClientProvider } from '@tanstack/react-query'
import { act } from 'react'
import { createRoot, type Root } from 'react-dom/client'
import { afterEach, describe, expect, it } from 'vitest'
import { toMillimetres } from '@kitwright/shared/domain/units'
import type { ShopSettings } from '@kitwright/shared/settings'
import { settingsKeys, useLengthUnit } from './shop-settings'

// Every length field in the app reads and shows lengths through useLengthUnit, in the shop's unit.
// Expected values are worked by hand from these facts:
// - 1 in = 25.4 mm exactly (international inch, 1959; NIST SP 811 Appendix B).
// - US shops write inches with fractions down to 1/16 in, as a tape measure reads (common practice);
//   4-1/4" and 4 1/4 are the same length written two ways (common practice).
// - 1/2 in Schedule 40 PVC is 0.840 in outside (ASTM D1785, from memory).

;(globalThis as { IS_REACT_ACT_ENVIRONMENT?: boolean }).IS_REACT_ACT_ENVIRONMENT = true

type LengthUnitApi = ReturnType<typeof useLengthUnit>
let root: Root | null = null

/** The hook as a component sees it, with the shop's settings already loaded (or none, when `unit` is null). */
function renderLengthUnit(unit: 'in' | 'mm' | null): LengthUnitApi {
  // No fetching in a unit test: the settings are put in the cache as the API would have answered.
  const client = new QueryClient({ defaultOptions: { queries: { enabled: unit !== null, retry: false } } })
  if (unit) client.setQueryData(settingsKeys.shop, { displayUnit: unit } as ShopSettings)
  let seen: LengthUnitApi | null = null
  function Probe() {
    seen = useLengthUnit()
    return null
  }
  const host = document.createElement('div')
  root = createRoot(host)
  act(() => root!.render(<QueryClientProvider client={client}><Probe /></QueryClientProvider>))
  if (!seen) throw new Error('the probe did not render')
  return seen
}

afterEach(() => {
  act(() => root?.unmount())
  root = null
})

const mm = (r: { ok: true; value: number } | { ok: false; message: string }) => {
  if (!r.ok) throw new Error(r.message)
  return toMillimetres(r.value)
}

describe('length input in an inch shop', () => {
  it('reads inch fractions, decimals with a unit, and millimetres', () => {
    const { unit, parse } = renderLengthUnit('in')
    expect(unit).toBe('in')
    expect(mm(parse('18 1/2'))).toBeCloseTo(18.5 * 25.4, 9) // 469.9 mm
    expect(mm(parse('18-1/2"'))).toBeCloseTo(469.9, 9)
    expect(mm(parse('4 1/4'))).toBeCloseTo(107.95, 9) // 4.25 × 25.4
    expect(mm(parse('0.840 in'))).toBeCloseTo(21.336, 3) // the pipe's OD, held to the nearest 0.625 µm
    expect(mm(parse('3/8'))).toBeCloseTo(9.525, 9) // 0.375 × 25.4
    expect(mm(parse('108 mm'))).toBeCloseTo(108, 9)
    expect(mm(parse('12'))).toBeCloseTo(304.8, 9) // a bare number is in the shop's unit
    expect(mm(parse("1' 2-1/2\""))).toBeCloseTo(14.5 * 25.4, 9) // 1 ft 2-1/2 in = 14-1/2 in
  })

  it('refuses what it cannot read, saying what to write instead', () => {
    const { parse } = renderLengthUnit('in')
    const message = (text: string) => {
      const r = parse(text)
      return r.ok ? null : r.message
    }
    expect(message('')).toMatch(/^Enter a length/)
    expect(message('18,5')).toBe('Write decimals with a point, not a comma: "18.5" instead of "18,5".')
    expect(message('-2')).toMatch(/cannot be negative/)
    expect(message('4 5/4')).toMatch(/should be less than 1/)
    expect(message('12 yards')).toMatch(/"yards" is not a unit Kitwright knows/)
  })

  it('shows lengths to the nearest 1/16 in, and fills inputs with text that reads back exactly', () => {
    const { parse, format, formatInput } = renderLengthUnit('in')
    const value = (text: string) => {
      const r = parse(text)
      if (!r.ok) throw new Error(r.message)
      return r.value
    }
    expect(format(value('18 1/2'))).toBe('18-1/2"')
    expect(format(value('0.840 in'))).toBe('13/16"') // 0.840 × 16 = 13.44 sixteenths → 13/16
    expect(format(value('108 mm'))).toBe('4-1/4"') // 108 ÷ 25.4 = 4.252 in → 68.03 sixteenths → 4-4/16
    // An input keeps the exact value: 0.840 in is no whole number of 64ths, so it stays a decimal.
    expect(formatInput(value('0.840 in'))).toBe('0.84 in')
    expect(formatInput(value('18 1/2'))).toBe('18-1/2"')
    expect(formatInput(value('10 ft'))).toBe('10 ft') // sticks are bought by the foot
    for (const text of ['0.840 in', '108 mm', '18 1/2', '3/64', '10 ft']) expect(parse(formatInput(value(text)))).toEqual({ ok: true, value: value(text) })
  })
})

describe('length input in a millimetre shop', () => {
  it('reads bare numbers as millimetres, still takes inches when marked, and refuses bare fractions', () => {
    const { unit, parse, format, formatInput } = renderLengthUnit('mm')
    expect(unit).toBe('mm')
    expect(mm(parse('108'))).toBeCloseTo(108, 9)
    expect(mm(parse('12.5'))).toBeCloseTo(12.5, 9)
    expect(mm(parse('18 1/2 in'))).toBeCloseTo(469.9, 9)
    const fraction = parse('3/8')
    expect(fraction.ok).toBe(false)
    expect(fraction.ok ? '' : fraction.message).toMatch(/only makes sense in inches: write "3\/8 in"/)
    const pipe = parse('0.840 in')
    if (!pipe.ok) throw new Error(pipe.message)
    expect(format(pipe.value)).toBe('21.3 mm') // 21.336 mm to one decimal
    expect(formatInput(pipe.value)).toBe('21.336 mm')
  })

  it('falls back to inches until the shop settings have loaded', () => {
    const { unit, format, parse } = renderLengthUnit(null)
    expect(unit).toBe('in')
    const r = parse('4 1/4')
    expect(r.ok && format(r.value)).toBe('4-1/4"')
  })
})

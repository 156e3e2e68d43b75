// @vitest-environment happy-dom
import { afterEach, beforeEach, describe, expect, it } from 'vitest'
import { KEEP_MS, KEY_GAP_MS, keepEarlyScans, takeEarlyScans } from './early-scans'

// A keyboard-wedge scanner types a code's characters then Enter as key presses, a few milliseconds
// apart (common practice); the clock here is moved by hand, so no test waits.
let now = 0
const clock = () => now
let stop: () => void
const press = (key: string, target: EventTarget = document.body) =>
  target.dispatchEvent(new KeyboardEvent('keydown', { key, bubbles: true, cancelable: true }))
function scan(text: string, { enter = true, gap = 5 } = {}) {
  for (const key of text) {
    now += gap
    press(key)
  }
  if (enter) {
    now += gap
    press('Enter')
  }
}

/** What a field appearing now would take, the field going again at once. */
function taken() {
  const field = takeEarlyScans(clock)
  field.release()
  return field
}

beforeEach(() => {
  now = 1_000_000
  stop = keepEarlyScans(clock)
  taken() // start each test with nothing kept
})
afterEach(() => {
  stop()
  document.body.innerHTML = ''
})

describe('scans typed before the scan field is on screen', () => {
  it('are handed, in order, to the field that appears next, and only once', () => {
    scan('BIN-0001')
    scan('BIN-0002')
    now += 300
    const field = takeEarlyScans(clock)
    expect(field.codes).toEqual(['BIN-0001', 'BIN-0002'])
    expect(field.partial).toBe('')
    field.release()
    expect(taken().codes).toEqual([])
  })

  it('finishes in the field a code the page interrupted half-way', () => {
    scan('U-10', { enter: false })
    const field = takeEarlyScans(clock)
    expect(field).toMatchObject({ codes: [], partial: 'U-10' })
    field.release()
  })

  it('leaves keys alone while a field is on screen, or when a text field has the focus', () => {
    const field = takeEarlyScans(clock)
    scan('BIN-0003') // the field on screen takes these itself
    field.release()
    const input = document.createElement('input')
    document.body.append(input)
    input.focus()
    for (const key of 'note') press(key, input)
    press('Enter', input)
    input.blur()
    expect(taken().codes).toEqual([])
  })

  it(`starts a new code after a pause longer than ${KEY_GAP_MS} ms, and drops codes older than ${KEEP_MS} ms`, () => {
    scan('ZZ', { enter: false })
    now += KEY_GAP_MS + 1
    scan('BIN-0004')
    now += KEEP_MS + 1
    scan('BIN-0005')
    const field = takeEarlyScans(clock)
    expect(field.codes).toEqual(['BIN-0005'])
    field.release()
  })

  it('ignores shortcuts and keys that type nothing', () => {
    document.dispatchEvent(new KeyboardEvent('keydown', { key: 'r', ctrlKey: true }))
    press('Shift')
    press('Tab')
    scan('PMP-400')
    expect(taken().codes).toEqual(['PMP-400'])
  })
})

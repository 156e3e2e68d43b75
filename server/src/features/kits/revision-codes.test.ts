import { describe, expect, it } from 'vitest'
import { nextRevisionCode } from './revision-codes'

describe('nextRevisionCode', () => {
  it('runs A, B, … Z, AA, AB', () => {
    expect(nextRevisionCode([])).toBe('A')
    expect(nextRevisionCode(['A'])).toBe('B')
    expect(nextRevisionCode(['B', 'A'])).toBe('C')
    expect(nextRevisionCode(['Z'])).toBe('AA')
    expect(nextRevisionCode(['AA', 'Z'])).toBe('AB')
    expect(nextRevisionCode(['AZ'])).toBe('BA')
  })
})

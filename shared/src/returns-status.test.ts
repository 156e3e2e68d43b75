import { describe, expect, it } from 'vitest'
import { DEFAULT_RETURN_REASONS, RETURN_DECISIONS, RETURN_DISPOSITIONS, RETURN_LABEL_STATUSES, RETURN_STATUSES } from './returns-status'
import { RETURN_DECISION_LABELS, RETURN_DISPOSITION_LABELS, RETURN_LABEL_STATUS_LABELS, RETURN_STATUS_LABELS, WORK_ORDER_STATUS_LABELS } from './status-words'

describe('the words of a return', () => {
  it('gives each return state its own word, plain shop English, and none a unit already uses', () => {
    const words = RETURN_STATUSES.map((s) => RETURN_STATUS_LABELS[s])
    expect(new Set(words).size).toBe(RETURN_STATUSES.length)
    for (const w of [...words, ...RETURN_LABEL_STATUSES.map((s) => RETURN_LABEL_STATUS_LABELS[s]), ...RETURN_DECISIONS.map((d) => RETURN_DECISION_LABELS[d])]) {
      expect(w).toMatch(/^[A-Z][a-z]+( [a-z]+)*$/)
    }
    // "Rework" is the unit's state at the build bench; the return says where it went, in other words.
    for (const w of words) expect(Object.values(WORK_ORDER_STATUS_LABELS)).not.toContain(w)
  })

  it('names what becomes of a returned unit in two different plain words', () => {
    const words = RETURN_DISPOSITIONS.map((d) => RETURN_DISPOSITION_LABELS[d])
    expect(new Set(words).size).toBe(RETURN_DISPOSITIONS.length)
    for (const w of words) expect(w).toMatch(/^[A-Z][a-z]+( [a-z]+)*$/)
  })

  it('decides into a state of the same name, and starts the shop with distinct default reasons', () => {
    for (const d of RETURN_DECISIONS) expect(RETURN_STATUSES).toContain(d)
    expect(new Set(DEFAULT_RETURN_REASONS.map((r) => r.toLowerCase())).size).toBe(DEFAULT_RETURN_REASONS.length)
  })
})

import { describe, expect, it } from 'vitest'
import { promiseShipDate, type PromiseInput } from './promise-date'

// Hand-worked examples; the working-day calendar (Monday to Friday) is checked against a 2026
// calendar by hand. The queue model (each bench one unit after another, in order) is common
// practice for a small shop, not a published standard.

const base: PromiseInput = {
  now: '2026-12-02T14:00:00Z', // a Wednesday, 6 h into an 8 h day that starts at 08:00 UTC
  dayStartHourUtc: 8,
  hoursPerDay: 8,
  minutesPerUnit: { cut: 10, build: 60, pack: 15 },
  unitsAhead: { cut: 3, build: 14, pack: 16 },
  ownUnits: { cut: 1, build: 1, pack: 1 },
  shortParts: [],
  minimumDate: '2026-12-02',
  minimumWorkingDays: 0,
}

describe('promiseShipDate', () => {
  it('follows the bench with the most work ahead', () => {
    // Now = minute 360 of Wednesday. Cut: queue clears at 360 + 3 × 10 = 390, ours done at 400.
    // Build: queue clears at 360 + 14 × 60 = 1200 (> 400), ours done at 1260.
    // Pack: queue clears at 360 + 16 × 15 = 600 (< 1260), ours done at 1275.
    // 1275 min / 480 per day → the 3rd working day counting Wednesday: Friday Dec 4.
    const r = promiseShipDate(base)
    expect(r.date).toBe('2026-12-04')
    // 14 × 60 = 840 min = 1.75 days → about 2 working days.
    expect(r.reasons[0]).toBe('build bench has 14 units ahead (about 2 working days)')
  })

  it('waits for short parts before the first bench can start', () => {
    // Pumps in on Monday Dec 14: 8 working days after Wednesday Dec 2 (Dec 3, 4, 7, 8, 9, 10, 11, 14)
    // → minute 8 × 480 = 3840. Then 10 + 60 + 15 = 85 min of our own work (the queues cleared long
    // before): done at 3925 → the 9th working day counting Wednesday: Monday Dec 14.
    const r = promiseShipDate({ ...base, shortParts: [{ name: 'pumps', arrives: '2026-12-14', how: 'supplier lead time' }] })
    expect(r.date).toBe('2026-12-14')
    expect(r.reasons[0]).toBe('waits for pumps due 2026-12-14 (supplier lead time)')
  })

  it('never promises sooner than the minimum lead time, and counts from Monday on a weekend', () => {
    // Saturday Dec 5: work starts Monday Dec 7 at minute 0; empty queues, 85 min of work → Monday.
    // The minimum of 3 working days after Saturday (the day it was placed) is Wednesday Dec 9 (Mon 1, Tue 2, Wed 3).
    const r = promiseShipDate({ ...base, now: '2026-12-05T10:00:00Z', unitsAhead: { cut: 0, build: 0, pack: 0 }, minimumDate: '2026-12-09', minimumWorkingDays: 3 })
    expect(r.date).toBe('2026-12-09')
    expect(r.reasons).toEqual(["the shop's minimum lead time of 3 working days"])
  })

  it('with no lead time, an order placed on a Sunday is promised on a working day', () => {
    // WORKDAY(Sunday Dec 6, 0) is Sunday Dec 6 itself (working-days.ts): the floor then binds nothing;
    // work starts Monday Dec 7 at minute 0 and 85 min of it ends that Monday.
    const r = promiseShipDate({ ...base, now: '2026-12-06T10:00:00Z', unitsAhead: { cut: 0, build: 0, pack: 0 }, minimumDate: '2026-12-06', minimumWorkingDays: 0 })
    expect(r.date).toBe('2026-12-07')
    expect(r.reasons).toEqual([])
  })

  it('a spare-parts pack goes straight to the pack bench', () => {
    // Only pack: its queue clears at 360 + 16 × 15 = 600, ours at 615 → 2nd working day: Thursday Dec 3.
    const r = promiseShipDate({ ...base, ownUnits: { cut: 0, build: 0, pack: 1 } })
    expect(r.date).toBe('2026-12-03')
    expect(r.reasons).toEqual(['pack bench has 16 units ahead (about 1 working day)'])
  })

  it('a day that ends exactly at the close ships that day', () => {
    // Wednesday 08:00: 480 min of own build work ends at minute 480, the close of Wednesday.
    const r = promiseShipDate({ ...base, now: '2026-12-02T08:00:00Z', unitsAhead: { cut: 0, build: 0, pack: 0 }, ownUnits: { cut: 0, build: 8, pack: 0 } })
    expect(r.date).toBe('2026-12-02')
  })
})

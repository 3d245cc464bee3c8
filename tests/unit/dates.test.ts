import { describe, expect, it } from 'vitest'
import { zonedInstant } from '../../shared/observing/clock'
import { isCalendarDate, LocalDate } from '../../shared/schemas/dates'

describe('calendar dates', () => {
  it('knows which days exist (Gregorian leap-year rule, common practice)', () => {
    expect(isCalendarDate('2026-02-28')).toBe(true)
    expect(isCalendarDate('2026-02-29')).toBe(false)
    expect(isCalendarDate('2028-02-29')).toBe(true)
    // Century years are leap years only when divisible by 400.
    expect(isCalendarDate('1900-02-29')).toBe(false)
    expect(isCalendarDate('2000-02-29')).toBe(true)
    expect(isCalendarDate('2026-02-30')).toBe(false)
    expect(isCalendarDate('2026-04-31')).toBe(false)
    expect(isCalendarDate('2026-13-01')).toBe(false)
    expect(isCalendarDate('2026-00-10')).toBe(false)
    expect(isCalendarDate('2026-12-31')).toBe(true)
  })

  it('accepts 1900 to 2100 only, with a message for each failure', () => {
    expect(LocalDate.safeParse('1900-01-01').success).toBe(true)
    expect(LocalDate.safeParse('2100-12-31').success).toBe(true)
    expect(LocalDate.safeParse('1899-12-31').error?.issues[0]?.message).toMatch(/1900 to 2100/)
    expect(LocalDate.safeParse('9999-12-31').error?.issues[0]?.message).toMatch(/1900 to 2100/)
    expect(LocalDate.safeParse('2026-02-30').error?.issues[0]?.message).toMatch(/does not exist/)
    expect(LocalDate.safeParse('26-02-03').error?.issues[0]?.message).toMatch(/YYYY-MM-DD/)
  })

  it('keeps a year below 100 as it is rather than as 19xx', () => {
    expect(zonedInstant('0099-03-01', '12:00', 'UTC').getUTCFullYear()).toBe(99)
    expect(zonedInstant('0099-03-01', '12:00', 'UTC').toISOString()).toBe('0099-03-01T12:00:00.000Z')
    expect(() => zonedInstant('2026-02-30', '12:00', 'UTC')).toThrow(RangeError)
  })
})

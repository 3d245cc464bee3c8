import { z } from 'zod'

// The years the computation is trusted for (astronomy-engine's models and this app's tests).
export const FIRST_YEAR = 1900
export const LAST_YEAR = 2100

/** Whether YYYY-MM-DD names a day that exists (no 30 February, 29 February only in leap years). */
export function isCalendarDate(text: string): boolean {
  const match = /^(\d{4})-(\d{2})-(\d{2})$/.exec(text)
  if (!match) return false
  const [year, month, day] = [Number(match[1]), Number(match[2]), Number(match[3])]
  if (month < 1 || month > 12 || day < 1) return false
  // Gregorian leap years: every fourth, but not centuries unless divisible by 400 (common practice).
  const leap = (year % 4 === 0 && year % 100 !== 0) || year % 400 === 0
  const days = [31, leap ? 29 : 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31][month - 1]!
  return day <= days
}

/** A local calendar date, YYYY-MM-DD, that exists and lies in the supported years (1900 to 2100). */
export const LocalDate = z.string()
  .regex(/^\d{4}-\d{2}-\d{2}$/, 'Enter the date as YYYY-MM-DD.')
  .refine(isCalendarDate, 'That day does not exist in the calendar.')
  .refine((s) => {
    const year = Number(s.slice(0, 4))
    return year >= FIRST_YEAR && year <= LAST_YEAR
  }, `Shadowline works with dates from ${FIRST_YEAR} to ${LAST_YEAR}.`)

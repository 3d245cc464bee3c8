// How angles read on every page: one decimal, a real minus sign for negative residuals, a dash when absent.

import { localDateTimeOf } from './clock'

export function formatDegrees(x: number | null | undefined, places = 1): string {
  return x == null ? '—' : `${x.toFixed(places)}°`
}

export function formatSigned(x: number | null | undefined): string {
  return x == null ? '—' : `${x >= 0 ? '+' : '−'}${Math.abs(x).toFixed(1)}°`
}

/**
 * A site-clock time read against the date a night is planned for: "21:40", "03:10 next morning",
 * "10:12 this morning", "14:05 the day after", "22:30 the evening before".
 */
export function clockOnNight(iso: string | null | undefined, timeZone: string, nightDate: string): string {
  if (!iso) return '—'
  const { date, time } = localDateTimeOf(new Date(iso), timeZone)
  const days = Math.round((Date.parse(`${date}T00:00:00Z`) - Date.parse(`${nightDate}T00:00:00Z`)) / 86_400_000)
  const morning = time < '12:00'
  if (days === 0) return morning ? `${time} this morning` : time
  if (days === 1) return morning ? `${time} next morning` : `${time} the day after`
  if (days === -1) return `${time} the ${morning ? 'morning' : 'evening'} before`
  return `${time} on ${date}`
}

// Input checks shared by the public functions. Every failure is a RangeError that names the field, so a
// form or an API route can show it as is; nothing invalid reaches the library, which would answer NaN.

import type { DiskView, Site } from './types'

// The library's series and its ΔT model are fitted to historical and near-future epochs; far outside them the
// numbers would still come out, quietly meaningless.
const EARLIEST = Date.UTC(1000, 0, 1)
const LATEST = Date.UTC(3000, 0, 1)

// astronomy-engine's atmosphere (used for refraction at rising and setting) starts at −500 m, below the Dead
// Sea shore; 10 km is above every mountain and covers an airliner. Higher, its rise/set search breaks down.
const LOWEST_ELEVATION_M = -500
const HIGHEST_ELEVATION_M = 10_000

function describe(value: unknown): string {
  if (typeof value === 'string') return JSON.stringify(value)
  if (value instanceof Date) return Number.isNaN(value.getTime()) ? 'Invalid Date' : value.toISOString()
  if (value === null) return 'null'
  if (typeof value === 'object') return 'an object'
  return String(value)
}

export function requireNumber(value: unknown, field: string, min: number, max: number): number {
  if (typeof value !== 'number' || !Number.isFinite(value) || value < min || value > max) {
    throw new RangeError(`${field} must be a number from ${min} to ${max}; got ${describe(value)}`)
  }
  return value
}

export function requireFinite(value: unknown, field: string): number {
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    throw new RangeError(`${field} must be a finite number; got ${describe(value)}`)
  }
  return value
}

export function requireDate(value: unknown, field: string): Date {
  if (!(value instanceof Date) || Number.isNaN(value.getTime())) {
    throw new RangeError(`${field} must be a valid Date; got ${describe(value)}`)
  }
  const ms = value.getTime()
  if (ms < EARLIEST || ms >= LATEST) {
    throw new RangeError(`${field} must fall between the years 1000 and 2999; got ${describe(value)}`)
  }
  return value
}

export function requireSite(value: unknown, field = 'site'): Required<Site> {
  if (typeof value !== 'object' || value === null) {
    throw new RangeError(`${field} must be an object with latitude and longitude; got ${describe(value)}`)
  }
  const site = value as Record<string, unknown>
  return {
    latitude: requireNumber(site.latitude, `${field}.latitude`, -90, 90),
    longitude: requireNumber(site.longitude, `${field}.longitude`, -180, 180),
    elevation: site.elevation === undefined
      ? 0
      : requireNumber(site.elevation, `${field}.elevation`, LOWEST_ELEVATION_M, HIGHEST_ELEVATION_M),
  }
}

export function requireOneOf<T extends string>(value: unknown, field: string, options: readonly T[]): T {
  if (typeof value !== 'string' || !(options as readonly string[]).includes(value)) {
    throw new RangeError(`${field} must be one of ${options.map(o => `'${o}'`).join(', ')}; got ${describe(value)}`)
  }
  return value as T
}

export function requireView(value: unknown, field = 'view'): DiskView {
  if (typeof value !== 'object' || value === null) {
    throw new RangeError(`${field} must be an object with orientation and flip; got ${describe(value)}`)
  }
  const view = value as Record<string, unknown>
  return {
    orientation: requireOneOf(view.orientation, `${field}.orientation`, ['north-up', 'zenith-up']),
    flip: requireOneOf(view.flip, `${field}.flip`, ['none', 'inverted', 'mirrored']),
  }
}

export interface CalendarDate {
  year: number
  month: number
  day: number
}

export function requireLocalDate(value: unknown, field: string): CalendarDate {
  const match = typeof value === 'string' ? /^(\d{4})-(\d{2})-(\d{2})$/.exec(value) : null
  if (match) {
    const [year, month, day] = [Number(match[1]), Number(match[2]), Number(match[3])]
    const probe = new Date(Date.UTC(year, month - 1, day))
    const real = probe.getUTCFullYear() === year && probe.getUTCMonth() === month - 1 && probe.getUTCDate() === day
    if (real && year >= 1000 && year <= 2999) return { year, month, day }
  }
  throw new RangeError(`${field} must be a calendar date written YYYY-MM-DD (years 1000–2999); got ${describe(value)}`)
}

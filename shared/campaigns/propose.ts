// Which nights a campaign asks for, and at what clock time: the observing windows of the lunation (evenings
// while the Moon waxes, mornings while it wanes, at any latitude), skipping those the windows rate as too
// close to the Sun or with the Moon below the horizon.

import { localDateTimeOf } from '../observing/clock'
import type { ObservingSite } from '../observing/night'
import { observingWindows, rateWindow, type ObservingWindow } from '../observing/windows'
import type { CampaignKind } from './types'

export interface ProposedNight {
  localDate: string
  at: string
  moonAltitudeDeg: number
  moonAzimuthDeg: number
  illuminatedFraction: number
  verdict: ObservingWindow['verdict']
  proposed: boolean
}

export interface CampaignProposal {
  kind: CampaignKind
  /** Every window of that kind in the span, with the ones proposed marked. */
  nights: ProposedNight[]
  /** The suggested clock time: the first proposed window's instant, rounded to the quarter hour. */
  clockTime: string | null
}

/** Rounds a local HH:MM to the nearest quarter hour (a clock time a class can remember). */
export function roundToQuarterHour(time: string): string {
  const minutes = Number(time.slice(0, 2)) * 60 + Number(time.slice(3, 5))
  const rounded = (Math.round(minutes / 15) * 15) % (24 * 60)
  return `${String(Math.floor(rounded / 60)).padStart(2, '0')}:${String(rounded % 60).padStart(2, '0')}`
}

/**
 * The first series of one kind (the waxing evenings, or the waning mornings) within `days` local dates from
 * `fromLocalDate`: a window is proposed when it is rated good or low (a low Moon still shows over a clear
 * horizon), never when the Moon is within the Sun's glare or below the horizon.
 */
export function proposeCampaign(kind: CampaignKind, fromLocalDate: string, days: number, site: ObservingSite): CampaignProposal {
  const all = observingWindows(fromLocalDate, days, site)
  const start = all.findIndex(w => w.kind === kind)
  const end = start < 0 ? start : all.findIndex((w, i) => i > start && w.kind !== kind)
  const windows = start < 0 ? [] : all.slice(start, end < 0 ? undefined : end)
  const nights = windows.map(w => ({
    localDate: w.localDate,
    at: w.at,
    moonAltitudeDeg: w.moonAltitudeDeg,
    moonAzimuthDeg: w.moonAzimuthDeg,
    illuminatedFraction: w.illuminatedFraction,
    verdict: w.verdict,
    proposed: w.verdict === 'good' || w.verdict === 'low',
  }))
  const first = nights.find(n => n.proposed)
  return {
    kind,
    nights,
    clockTime: first ? roundToQuarterHour(localDateTimeOf(new Date(first.at), site.timeZone).time) : null,
  }
}

/** The clock time a campaign observes at by default: its first night's window (twilight), rounded. */
export function defaultClockTime(kind: CampaignKind, firstNight: string, site: ObservingSite): string {
  return roundToQuarterHour(localDateTimeOf(new Date(rateWindow(firstNight, kind, site).at), site.timeZone).time)
}

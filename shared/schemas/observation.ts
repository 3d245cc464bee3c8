import { z } from 'zod'
import { PHASE_NAMES } from '../observing/phases'

import { LocalDate } from './dates'

const LocalTime = z.string().regex(/^([01]\d|2[0-3]):[0-5]\d(:[0-5]\d)?$/, 'Enter the time as HH:MM (24-hour clock).')

const positive = (what: string, max: number) => z.number({ error: `Enter the ${what}.` })
  .positive(`The ${what} must be more than zero.`)
  .max(max, `The ${what} must be at most ${max}.`)

export const Instrument = z.discriminatedUnion('kind', [
  z.object({ kind: z.literal('naked-eye') }),
  z.object({
    kind: z.literal('binoculars'),
    magnification: positive('magnification', 100),
    apertureMm: positive('aperture', 300),
  }),
  z.object({
    kind: z.literal('telescope'),
    apertureMm: positive('aperture', 2000),
    focalLengthMm: positive('focal length', 40_000).nullish(),
    eyepieceMm: positive('eyepiece focal length', 100).nullish(),
    magnification: positive('magnification', 2000).nullish(),
  }).refine(t => t.magnification || (t.focalLengthMm && t.eyepieceMm), {
    message: 'Give the magnification, or the focal lengths of the telescope and the eyepiece.',
    path: ['magnification'],
  }),
], { error: 'Choose naked eye, binoculars or telescope.' })

const Scale = (what: string, low: string, high: string) => z.number().int(`The ${what} is a whole number.`)
  .min(1, `The ${what} runs from 1 (${low}) to 5 (${high}).`)
  .max(5, `The ${what} runs from 1 (${low}) to 5 (${high}).`)

export const ObservationBody = z.object({
  siteId: z.uuid('Choose one of your sites.'),
  localDate: LocalDate,
  localTime: LocalTime,
  instrument: Instrument,
  view: z.enum(['upright', 'inverted', 'mirrored'], { error: 'Choose how the instrument shows the Moon.' }),
  seeing: Scale('Antoniadi seeing', 'I, perfect', 'V, very bad').nullish(),
  transparency: Scale('transparency', 'very poor', 'excellent').nullish(),
  notes: z.string().max(4000, 'Notes are limited to 4000 characters.').default(''),
  clinometerReadingDeg: z.number().min(0, 'A protractor reads from 0° to 180°.').max(180, 'A protractor reads from 0° to 180°.').nullish(),
  compassBearingDeg: z.number().min(0, 'A compass bearing runs from 0° to 360°.').max(360, 'A compass bearing runs from 0° to 360°.').nullish(),
})

export type ObservationInput = z.infer<typeof ObservationBody>

export const OBSERVATION_SORTS = ['observedAt', 'illuminatedFraction', 'ageDays', 'colongitude', 'site'] as const

export const ObservationListQuery = z.object({
  siteId: z.uuid().optional(),
  from: LocalDate.optional(),
  to: LocalDate.optional(),
  phase: z.enum(PHASE_NAMES as [string, ...string[]]).optional(),
  sort: z.enum(OBSERVATION_SORTS).default('observedAt'),
  dir: z.enum(['asc', 'desc']).default('desc'),
  page: z.coerce.number().int().min(1).max(100_000).default(1),
  perPage: z.coerce.number().int().min(1).max(200).default(25),
})

export type ObservationListQuery = z.infer<typeof ObservationListQuery>

export const WorksheetQuery = z.object({
  date: LocalDate.optional(),
  siteId: z.uuid().optional(),
})

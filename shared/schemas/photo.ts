import { z } from 'zod'
import { LocalDate } from './dates'

export const PhotoUploadFields = z.object({
  siteId: z.uuid('Choose one of your sites.'),
  /** Optional correction of the capture time, as the site's clock shows it. */
  localDate: LocalDate.optional(),
  localTime: z.string().regex(/^([01]\d|2[0-3]):[0-5]\d(:[0-5]\d)?$/, 'Enter the time as HH:MM.').optional(),
})

export const PhotoTimeBody = z.object({
  localDate: LocalDate,
  localTime: z.string().regex(/^([01]\d|2[0-3]):[0-5]\d(:[0-5]\d)?$/, 'Enter the time as HH:MM.'),
})

export const PhotoListQuery = z.object({
  siteId: z.uuid().optional(),
})

export const PhotoImageQuery = z.object({
  size: z.enum(['thumb', 'full']).default('thumb'),
})

export interface PhotoView {
  id: string
  observationId: string
  siteId: string
  siteName: string
  takenAt: string
  takenAtSource: 'exif' | 'observer' | 'upload'
  localDate: string
  localTime: string
  width: number
  height: number
  moonAltitudeDeg: number
  moonAzimuthDeg: number
  illuminatedFraction: number
}

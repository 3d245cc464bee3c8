import { z } from 'zod'

export const PhotoUploadFields = z.object({
  siteId: z.uuid('Choose one of your sites.'),
  /** Optional correction of the capture time, as the site's clock shows it. */
  localDate: z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'Enter the date as YYYY-MM-DD.').optional(),
  localTime: z.string().regex(/^([01]\d|2[0-3]):[0-5]\d(:[0-5]\d)?$/, 'Enter the time as HH:MM.').optional(),
})

export const PhotoTimeBody = z.object({
  localDate: z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'Enter the date as YYYY-MM-DD.'),
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

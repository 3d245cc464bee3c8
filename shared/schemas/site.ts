import { z } from 'zod'
import { isValidTimeZone } from '../observing/clock'

// eslint-disable-next-line no-control-regex
const NO_CONTROL = /^[^\u0000-\u001F\u007F]*$/

export const SiteName = z.string().trim()
  .min(1, 'Give the site a name.')
  .max(80, 'Use at most 80 characters.')
  .regex(NO_CONTROL, 'Use letters, digits and punctuation only.')

export const Latitude = z.number({ error: 'Enter the latitude in degrees.' })
  .min(-90, 'Latitude runs from −90° (south) to 90° (north).')
  .max(90, 'Latitude runs from −90° (south) to 90° (north).')

export const Longitude = z.number({ error: 'Enter the longitude in degrees.' })
  .min(-180, 'Longitude runs from −180° (west) to 180° (east).')
  .max(180, 'Longitude runs from −180° (west) to 180° (east).')

export const SiteBody = z.object({
  name: SiteName,
  latitude: Latitude,
  longitude: Longitude,
  elevation: z.number({ error: 'Enter the elevation in metres.' })
    .min(-450, 'Elevation must be above −450 m.')
    .max(6000, 'Elevation must be below 6000 m.')
    .default(0),
  timeZone: z.string().trim().max(64)
    .refine(isValidTimeZone, 'Use a time zone name such as Europe/London.')
    .optional(),
})

export const SitePatch = SiteBody.partial()

export const TimeZoneQuery = z.object({
  latitude: z.coerce.number().pipe(Latitude),
  longitude: z.coerce.number().pipe(Longitude),
})

export type SiteInput = z.infer<typeof SiteBody>

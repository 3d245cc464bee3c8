import { z } from 'zod'
import { LocalDate } from './dates'

export const TonightQuery = z.object({
  siteId: z.uuid('Choose one of your sites.'),
  date: LocalDate,
})

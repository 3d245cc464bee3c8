import { z } from 'zod'

export const TonightQuery = z.object({
  siteId: z.uuid('Choose one of your sites.'),
  date: z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'Enter the date as YYYY-MM-DD.')
    .refine(s => Number(s.slice(0, 4)) >= 1900 && Number(s.slice(0, 4)) <= 2100, 'Shadowline plans nights from 1900 to 2100.'),
})

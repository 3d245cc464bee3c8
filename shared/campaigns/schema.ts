import { z } from 'zod'

const LocalDate = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'Enter the date as YYYY-MM-DD.')
  .refine(s => !Number.isNaN(Date.parse(`${s}T12:00:00Z`)), 'That is not a calendar date.')
const ClockTime = z.string().regex(/^([01]\d|2[0-3]):[0-5]\d$/, 'Enter the time as HH:MM (24-hour clock).')
// eslint-disable-next-line no-control-regex
const NO_CONTROL = /^[^\u0000-\u001F\u007F]*$/

export const CAMPAIGN_KINDS = ['evening', 'morning'] as const

export const CampaignBody = z.object({
  title: z.string().trim().min(1, 'Give the campaign a title.').max(100, 'Use at most 100 characters.').regex(NO_CONTROL, 'Use letters, digits and punctuation only.'),
  brief: z.string().trim().max(2000, 'Keep the brief under 2000 characters.').default(''),
  kind: z.enum(CAMPAIGN_KINDS, { error: 'Choose evening (waxing) or morning (waning).' }),
  groupSiteId: z.uuid('Choose one of the group\'s sites.'),
  clockTime: ClockTime.optional(),
  nights: z.array(LocalDate).min(1, 'Choose at least one night.').max(31, 'A campaign has at most 31 nights.')
    .refine(n => new Set(n).size === n.length, 'A night is listed twice.'),
  asks: z.object({
    sketch: z.boolean(),
    altitude: z.boolean(),
    azimuth: z.boolean(),
  }).refine(a => a.sketch || a.altitude || a.azimuth, 'Ask for at least one of sketch, altitude or azimuth.'),
  reminderMinutes: z.number().int().min(10, 'Remind at least 10 minutes before.').max(600, 'Remind at most 10 hours before.').default(60),
})

export const CampaignPatch = z.object({
  title: CampaignBody.shape.title.optional(),
  brief: CampaignBody.shape.brief.optional(),
  clockTime: ClockTime.optional(),
  nights: CampaignBody.shape.nights.optional(),
}).refine(b => Object.keys(b).length > 0, 'Nothing to change.')

export const ProposalQuery = z.object({
  groupSiteId: z.uuid('Choose one of the group\'s sites.'),
  kind: z.enum(CAMPAIGN_KINDS, { error: 'Choose evening (waxing) or morning (waning).' }),
  from: LocalDate,
  days: z.coerce.number().int().min(1).max(31).default(31),
})

export const CampaignParams = z.object({ id: z.uuid('Unknown campaign.') })
export const CampaignMemberParams = CampaignParams.extend({ userId: z.uuid('Unknown member.') })

export const CommentBody = z.object({
  memberId: z.uuid('Unknown member.'),
  localDate: LocalDate,
  body: z.string().trim().min(1, 'Write a comment.').max(2000, 'Keep the comment under 2000 characters.'),
})

export const OptOutBody = z.object({
  token: z.string().min(20, 'This link is incomplete.').max(300),
})

export type CampaignInput = z.infer<typeof CampaignBody>

import { z } from 'zod'
import { Email, DisplayName, NewPassword } from './auth'
import { SiteBody } from './site'

// eslint-disable-next-line no-control-regex
const NO_CONTROL = /^[^\u0000-\u001F\u007F]*$/

export const GroupName = z.string().trim()
  .min(1, 'Give the group a name.')
  .max(80, 'Use at most 80 characters.')
  .regex(NO_CONTROL, 'Use letters, digits and punctuation only.')

export const GroupBody = z.object({
  name: GroupName,
  description: z.string().trim().max(500, 'Keep the description under 500 characters.').default(''),
  visibility: z.enum(['private', 'listed'], { error: 'Choose private or listed.' }).default('private'),
})

export const GroupPatch = GroupBody.partial().refine(b => Object.keys(b).length > 0, 'Nothing to change.')

export const GroupSiteBody = SiteBody

export const GroupParams = z.object({ id: z.uuid('Unknown group.') })
export const GroupSiteParams = GroupParams.extend({ siteId: z.uuid('Unknown site.') })
export const GroupMemberParams = GroupParams.extend({ userId: z.uuid('Unknown member.') })
export const InvitationParams = GroupParams.extend({ invitationId: z.uuid('Unknown invitation.') })

export const InviteBody = z.object({
  emails: z.array(Email).min(1, 'Enter at least one e-mail address.').max(60, 'Invite at most 60 people at a time.'),
})

export const JoinCodeBody = z.object({
  action: z.enum(['rotate', 'off'], { error: 'Choose rotate or off.' }),
  approval: z.boolean().optional(),
})

/** Eight letters and digits from an alphabet without look-alikes (no 0/O, 1/I/L), grouped 4-4 when shown. */
export const JOIN_CODE_ALPHABET = 'ABCDEFGHJKMNPQRSTUVWXYZ23456789'

export const JoinBody = z.object({
  code: z.string().trim().toUpperCase()
    .transform(s => s.replace(/[\s-]/g, ''))
    .pipe(z.string().regex(/^[A-Z0-9]{8}$/, 'A join code has eight letters and digits.')),
})

export const MemberPatch = z.object({
  role: z.enum(['co-leader', 'member'], { error: 'Choose co-leader or member.' }).optional(),
  approve: z.literal(true).optional(),
}).refine(b => b.role !== undefined || b.approve !== undefined, 'Nothing to change.')

export const MembershipPatch = z.object({
  reminders: z.boolean({ error: 'Say whether to send reminders.' }),
})

export const InvitationToken = z.object({
  token: z.string().min(20, 'This invitation link is incomplete.').max(200),
})

export const InvitationSignUpBody = InvitationToken.extend({
  name: DisplayName,
  password: NewPassword,
})

export type GroupInput = z.infer<typeof GroupBody>

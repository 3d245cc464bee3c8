import { z } from 'zod'
import { ROLES } from '../roles'

// Shared by the forms and the server routes so both say the same thing.

export const Email = z.string().trim().toLowerCase()
  .min(3, 'Enter your e-mail address.')
  .max(254, 'That e-mail address is too long.')
  .pipe(z.email('Enter a valid e-mail address.'))

export const NewPassword = z.string()
  .min(10, 'Use at least 10 characters.')
  .max(200, 'Use at most 200 characters.')

export const DisplayName = z.string().trim()
  .min(1, 'Enter a name to show to your group.')
  .max(80, 'Use at most 80 characters.')
  // eslint-disable-next-line no-control-regex
  .regex(/^[^\u0000-\u001F\u007F]*$/, 'Use letters, digits and punctuation only.')

export const SignUpBody = z.object({
  name: DisplayName,
  email: Email,
  password: NewPassword,
})

export const SignInBody = z.object({
  email: Email,
  password: z.string().min(1, 'Enter your password.').max(200),
})

export const TokenBody = z.object({
  token: z.string().min(20, 'This link is incomplete.').max(200),
})

export const ForgotBody = z.object({ email: Email })

export const ResetBody = TokenBody.extend({ password: NewPassword })

export const PasswordChangeBody = z.object({
  currentPassword: z.string().min(1, 'Enter your current password.').max(200),
  password: NewPassword,
})

export const RoleChangeBody = z.object({
  role: z.enum(ROLES).optional(),
  disabled: z.boolean().optional(),
}).refine(b => b.role !== undefined || b.disabled !== undefined, 'Nothing to change.')

export const IdParams = z.object({ id: z.uuid('Unknown id.') })

export type SignUpInput = z.infer<typeof SignUpBody>
export type SignInInput = z.infer<typeof SignInBody>

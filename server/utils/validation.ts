import type { z } from 'zod'

/**
 * Turns a zod schema into a validator for h3's readValidatedBody / getValidatedQuery /
 * getValidatedRouterParams. A failure is a 400 whose message names the first problem
 * and whose data lists every field's messages, which the client helper maps onto the form.
 */
export function parseWith<T extends z.ZodType>(schema: T) {
  return (input: unknown): z.infer<T> => {
    const result = schema.safeParse(input)
    if (result.success) return result.data
    const fields: Record<string, string[]> = {}
    for (const issue of result.error.issues) {
      const key = issue.path.join('.') || '_'
      ;(fields[key] ??= []).push(issue.message)
    }
    const first = result.error.issues[0]
    const where = first?.path.length ? `${first.path.join('.')}: ` : ''
    throw createError({
      status: 400,
      message: `${where}${first?.message ?? 'Invalid input'}`,
      data: { fields },
    })
  }
}

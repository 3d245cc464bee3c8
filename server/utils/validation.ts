import type { z } from 'zod'

/**
 * Turns a zod schema into a validator for h3's readValidatedBody / getValidatedQuery /
 * getValidatedRouterParams. h3 answers a failure with 400 and the thrown error as
 * `data`; the error carries every field's messages (`data.fields`), which the client
 * helper maps onto the form, and its message names the first problem.
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
    throw Object.assign(new Error(`${where}${first?.message ?? 'Invalid input'}`), { fields })
  }
}

/**
 * Runs a `parseWith` validator outside h3's readValidated* helpers (multipart fields, say) and answers a
 * failure the same way they do: 400, the first problem as the message, every field's messages in `data`.
 */
export function validated<T>(validate: (input: unknown) => T, input: unknown): T {
  try {
    return validate(input)
  }
  catch (error) {
    const message = error instanceof Error ? error.message : 'Invalid input'
    throw createError({ status: 400, statusMessage: 'Validation Error', message, data: error })
  }
}

import { FetchError } from 'ofetch'

interface ApiErrorData {
  message?: string
  data?: { fields?: Record<string, string[]> }
}

/** One place that turns a failed request into words for the form. */
export function apiErrorMessage(error: unknown): string {
  if (error instanceof FetchError) {
    const body = error.data as ApiErrorData | undefined
    if (body?.message) return body.message
    if (error.statusCode === 429) return 'Too many attempts; please wait a little.'
    if (!error.statusCode) return 'The server could not be reached. Check the connection and try again.'
    return `Something went wrong (${error.statusCode}).`
  }
  return error instanceof Error ? error.message : 'Something went wrong.'
}

/** Per-field messages from a 400 answer, keyed by field name. */
export function apiFieldErrors(error: unknown): Record<string, string> {
  if (!(error instanceof FetchError)) return {}
  const fields = (error.data as ApiErrorData | undefined)?.data?.fields ?? {}
  return Object.fromEntries(Object.entries(fields).map(([key, messages]) => [key, messages[0] ?? '']))
}

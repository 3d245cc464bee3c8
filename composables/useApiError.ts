import { FetchError } from 'ofetch'

interface ApiErrorData {
  message?: string
  data?: { fields?: Record<string, string[]> }
}

/** The parts of a failed request every error shape carries: a FetchError from $fetch, or the error useFetch gives. */
function partsOf(error: unknown): { body?: ApiErrorData, status?: number } | null {
  if (error instanceof FetchError) return { body: error.data as ApiErrorData | undefined, status: error.statusCode }
  if (error && typeof error === 'object' && ('statusCode' in error || 'data' in error)) {
    const e = error as { data?: unknown, statusCode?: number }
    const body = e.data && typeof e.data === 'object' ? e.data as ApiErrorData : undefined
    return { body, status: e.statusCode }
  }
  return null
}

/**
 * A server message in the form's words: the field path that validation puts in front ("clinometerReadingDeg:
 * …") is dropped, since the form shows each message beside its own labelled field.
 */
function withoutFieldPath(message: string, fields: Record<string, string[]> | undefined): string {
  const colon = message.indexOf(': ')
  if (colon > 0 && /^[\w.]+$/.test(message.slice(0, colon)) && fields && message.slice(0, colon) in fields) return message.slice(colon + 2)
  return message
}

/** One place that turns a failed request into words for the form. */
export function apiErrorMessage(error: unknown): string {
  const parts = partsOf(error)
  if (parts) {
    const { body, status } = parts
    if (body?.message && !/^\[(GET|POST|PUT|PATCH|DELETE)\]/.test(body.message)) return withoutFieldPath(body.message, body.data?.fields)
    if (status === 429) return 'Too many attempts; please wait a little.'
    if (status === 400) return 'Some of the values are not valid; check them and try again.'
    if (status === 404) return 'Not found: it may have been deleted, or it is not yours.'
    if (!status) return 'The server could not be reached. Check the connection and try again.'
    return `Something went wrong (${status}).`
  }
  return error instanceof Error ? error.message : 'Something went wrong.'
}

/** Per-field messages from a 400 answer, keyed by field name. */
export function apiFieldErrors(error: unknown): Record<string, string> {
  const fields = partsOf(error)?.body?.data?.fields ?? {}
  return Object.fromEntries(Object.entries(fields).map(([key, messages]) => [key, messages[0] ?? '']))
}

import { createError } from 'h3'
import { FetchError } from 'ofetch'
import { describe, expect, it } from 'vitest'
import { apiErrorMessage, apiFieldErrors } from '../../composables/useApiError'

/** A failed request as $fetch throws it: the server's JSON body in `data`. */
function fetchError(status: number, body: unknown): FetchError {
  const error = new FetchError(`[GET] "/api/atlas?colongitudeMin=400": ${status} Validation Error`)
  Object.assign(error, { statusCode: status, data: body })
  return error
}

describe('API errors in words', () => {
  const body = {
    statusCode: 400,
    message: 'clinometerReadingDeg: Enter the reading from 0° to 180°.',
    data: { fields: { clinometerReadingDeg: ['Enter the reading from 0° to 180°.'] } },
  }

  it('never shows a field name, only the message the form shows beside its labelled field', () => {
    expect(apiErrorMessage(fetchError(400, body))).toBe('Enter the reading from 0° to 180°.')
    expect(apiFieldErrors(fetchError(400, body))).toEqual({ clinometerReadingDeg: 'Enter the reading from 0° to 180°.' })
  })

  it('reads the error useFetch gives (the fetch error wrapped by createError) the same way, never "[GET] … 400"', () => {
    const wrapped = createError(fetchError(400, body))
    expect(apiErrorMessage(wrapped)).toBe('Enter the reading from 0° to 180°.')
    expect(apiFieldErrors(wrapped)).toEqual({ clinometerReadingDeg: 'Enter the reading from 0° to 180°.' })
    const bare = createError(fetchError(400, undefined))
    expect(apiErrorMessage(bare)).not.toMatch(/\[GET\]|Validation Error/)
  })

  it('keeps a plain sentence with a colon as it is', () => {
    expect(apiErrorMessage(fetchError(409, { message: 'Note: this sketch is in review.' }))).toBe('Note: this sketch is in review.')
  })
})

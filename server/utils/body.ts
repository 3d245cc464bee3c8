import type { H3Event } from 'h3'

/**
 * Reads a request body, refusing it with 413 as soon as it passes `maxBytes`, whether or not a length was
 * declared: a chunked upload cannot fill the server's memory.
 */
export function readLimitedBody(event: H3Event, maxBytes: number, tooLargeMessage: string): Promise<Buffer> {
  const tooLarge = () => createError({ status: 413, message: tooLargeMessage })
  const declared = Number(getRequestHeader(event, 'content-length'))
  if (Number.isFinite(declared) && declared > maxBytes) return Promise.reject(tooLarge())
  const request = event.node.req
  return new Promise((resolve, reject) => {
    const chunks: Buffer[] = []
    let total = 0
    let refused = false
    request.on('data', (chunk: Buffer) => {
      total += chunk.length
      if (total > maxBytes && !refused) {
        refused = true
        chunks.length = 0
        reject(tooLarge())
      }
      if (!refused) chunks.push(chunk)
    })
    request.on('end', () => {
      if (!refused) resolve(Buffer.concat(chunks))
    })
    request.on('error', reject)
  })
}

export interface MultipartParts {
  fields: Record<string, string>
  files: Map<string, { name: string, bytes: Uint8Array }>
}

/** Splits a multipart/form-data body into its text fields and files; 415 for any other body. */
export async function readMultipart(event: H3Event, body: Buffer, what: string): Promise<MultipartParts> {
  const type = getRequestHeader(event, 'content-type') ?? ''
  if (!/^multipart\/form-data;/i.test(type)) {
    throw createError({ status: 415, message: `Send the ${what} as multipart/form-data.` })
  }
  const form = await new Response(new Uint8Array(body), { headers: { 'content-type': type } }).formData().catch(() => {
    throw createError({ status: 400, message: `The ${what} could not be read as multipart/form-data.` })
  })
  const parts: MultipartParts = { fields: {}, files: new Map() }
  for (const [name, value] of form.entries()) {
    if (typeof value === 'string') parts.fields[name] = value
    else parts.files.set(name, { name: value.name, bytes: new Uint8Array(await value.arrayBuffer()) })
  }
  return parts
}

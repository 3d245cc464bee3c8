import { STATUS_CODES } from 'node:http'
import { H3Error } from 'h3'

// Pages may load only what the app itself serves. Nuxt writes its start-up data as an inline script and Vue
// binds inline styles, hence 'unsafe-inline' there; nothing else is allowed in from elsewhere.
const PAGE_POLICY = [
  'default-src \'self\'',
  'script-src \'self\' \'unsafe-inline\'',
  'style-src \'self\' \'unsafe-inline\'',
  'img-src \'self\' data: blob:',
  'font-src \'self\' data:',
  'connect-src \'self\'',
  'worker-src \'self\'',
  'object-src \'none\'',
  'base-uri \'self\'',
  'form-action \'self\'',
  'frame-ancestors \'none\'',
].join('; ')

export default defineNitroPlugin((nitro) => {
  // An error made with only a message would otherwise be answered with "Server Error" as its status text,
  // even a 404; give it the standard reason phrase of its status.
  nitro.hooks.hook('error', (error) => {
    if (error instanceof H3Error && !error.statusMessage) {
      error.statusMessage = STATUS_CODES[error.statusCode] ?? 'Error'
    }
  })
  nitro.hooks.hook('render:response', (response) => {
    const headers = response.headers ??= {}
    delete headers['x-powered-by']
    if (String(headers['content-type'] ?? '').startsWith('text/html')) headers['content-security-policy'] = PAGE_POLICY
  })
})

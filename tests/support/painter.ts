import { resolve } from 'node:path'
import { build } from 'vite'

const ROOT = resolve(import.meta.dirname, '../..')

/** tests/support/painter-page.ts as one plain script for a chromium page (`page.addScriptTag`). */
export async function painterBundle(): Promise<string> {
  const out = await build({
    configFile: false,
    logLevel: 'silent',
    root: ROOT,
    resolve: { alias: { '#shared': resolve(ROOT, 'shared') } },
    build: { write: false, minify: false, lib: { entry: resolve(ROOT, 'tests/support/painter-page.ts'), formats: ['iife'], name: 'sketchPainterBundle' } },
  })
  const result = Array.isArray(out) ? out[0]! : out
  if (!('output' in result)) throw new Error('The painter bundle did not build')
  return result.output[0].code
}

import { mkdirSync } from 'node:fs'
import { join, resolve } from 'node:path'
import { chromium, type Browser, type Page } from 'playwright-core'

export const ARTIFACTS = resolve(import.meta.dirname, '../e2e/artifacts')

/** Debian's chromium; no browser is ever downloaded. */
export async function launchBrowser(): Promise<Browser> {
  mkdirSync(ARTIFACTS, { recursive: true })
  return chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    args: [
      '--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run',
      '--disable-background-networking', '--disable-component-update', '--disable-sync',
    ],
  })
}

export function artifact(name: string): string {
  return join(ARTIFACTS, name)
}

/** Opens a page and waits until the app has hydrated it, so typed values reach the forms' state. */
export async function openReady(page: Page, url: string): Promise<void> {
  await page.goto(url)
  await page.waitForSelector('html[data-hydrated="true"]', { state: 'attached' })
}

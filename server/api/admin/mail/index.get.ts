import { readdir, readFile } from 'node:fs/promises'
import { join } from 'node:path'
import { simpleParser } from 'mailparser'
import type { CaughtMail } from '#shared/types/api'

const SHOWN = 100

// Mail kept by the embedded catcher. There is none to show when a real SMTP host
// is configured, so the route does not exist then.
export default defineEventHandler(async (event): Promise<CaughtMail[]> => {
  await requireRole(event, 'admin')
  const directory = mailCatcherDirectory()
  if (!directory) throw createError({ status: 404, message: 'Mail goes to a real SMTP server; nothing is caught here.' })
  const names = (await readdir(directory)).filter(n => n.endsWith('.eml')).sort().reverse().slice(0, SHOWN)
  return Promise.all(names.map(async (name) => {
    const parsed = await simpleParser(await readFile(join(directory, name)))
    const to = Array.isArray(parsed.to) ? parsed.to.map(a => a.text).join(', ') : parsed.to?.text ?? ''
    return {
      id: name.replace(/\.eml$/, ''),
      receivedAt: (parsed.date ?? new Date()).toISOString(),
      from: parsed.from?.text ?? '',
      to,
      subject: parsed.subject ?? '',
      text: parsed.text ?? '',
    }
  }))
})

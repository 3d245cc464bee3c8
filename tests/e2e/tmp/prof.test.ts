import { writeFileSync } from 'node:fs'
import { it } from 'vitest'
import { DEMO, startApp } from '../../support/app'
import { launchBrowser } from '../../support/browser'
import { insertObservation } from '../../support/observations'

it('profile', async () => {
  const app = await startApp()
  const browser = await launchBrowser()
  try {
    const observationId = insertObservation(app.dataDir, { email: DEMO.observer.email, observedAt: '2026-02-23T19:00:00Z', view: 'upright' })
    const context = await browser.newContext({ viewport: { width: 1280, height: 800 } })
    await context.request.post(`${app.url}/api/auth/sign-in`, { data: { email: DEMO.observer.email, password: DEMO.observer.password } })
    const id = (await (await context.request.post(`${app.url}/api/sketches`, { data: { observationId } })).json()).id
    const strokes = Array.from({ length: 2000 }, (_, n) => ({ id: `s${n}`, tool: 'pencil', tone: 1, size: 6, pen: true, points: Array.from({ length: 100 }, (_, i) => [500 + i * 5 + n % 50, 500 + n / 2 + Math.sin(i / 5) * 30, 0.5]).flat() }))
    await context.request.put(`${app.url}/api/sketches/${id}`, { data: { baseVersion: 1, saveId: crypto.randomUUID(), orientation: 'zenith-up', flip: 'none', shapes: { schemaVersion: 1, frame: { size: 2048, diskRadius: 860 }, strokes } } })
    const page = await context.newPage()
    await page.goto(`${app.url}/sketches/${id}`)
    await page.waitForFunction(() => performance.getEntriesByName('sketch:painted').length > 0, undefined, { timeout: 120_000 })
    const box = (await page.getByTestId('sketch-canvas').boundingBox())!
    const cdp = await context.newCDPSession(page)
    await cdp.send('Profiler.enable')
    await cdp.send('Profiler.setSamplingInterval', { interval: 200 })
    await cdp.send('Profiler.start')
    for (let s = 0; s < 8; s++) {
      const at = (i: number) => ({ x: box.x + 200 + i * 6, y: box.y + 150 + s * 20 })
      await cdp.send('Input.dispatchMouseEvent', { type: 'mousePressed', ...at(0), button: 'left', buttons: 1, clickCount: 1, pointerType: 'pen', force: 0.5 } as never)
      for (let i = 1; i <= 25; i++) {
        await cdp.send('Input.dispatchMouseEvent', { type: 'mouseMoved', ...at(i), button: 'left', buttons: 1, pointerType: 'pen', force: 0.5 } as never)
        await new Promise(r => setTimeout(r, 8))
      }
      await cdp.send('Input.dispatchMouseEvent', { type: 'mouseReleased', ...at(25), button: 'left', buttons: 0, clickCount: 1, pointerType: 'pen', force: 0 } as never)
    }
    const { profile } = await cdp.send('Profiler.stop') as { profile: { nodes: { id: number, callFrame: { functionName: string, url: string, lineNumber: number } }[], samples: number[], timeDeltas: number[] } }
    const self = new Map<string, number>()
    const byId = new Map(profile.nodes.map(n => [n.id, n]))
    profile.samples.forEach((id, i) => {
      const n = byId.get(id)!
      const key = `${n.callFrame.functionName || '(anon)'} ${n.callFrame.url.split('/').pop()}:${n.callFrame.lineNumber}`
      self.set(key, (self.get(key) ?? 0) + (profile.timeDeltas[i] ?? 0))
    })
    const top = [...self].sort((a, b) => b[1] - a[1]).slice(0, 25)
    writeFileSync('/tmp/prof.txt', top.map(([k, v]) => `${(v / 1000).toFixed(1)}ms ${k}`).join('\n'))
  }
  finally {
    await browser.close()
    await app.stop()
  }
}, 300_000)

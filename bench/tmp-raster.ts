import { paintPixels } from '../server/utils/raster'
for (const shadeEvery of [0, 10]) {
  const strokes = Array.from({ length: 2000 }, (_, n) => ({ id: `s${n}`, tool: shadeEvery && n % shadeEvery === 3 ? 'shade' : 'pencil', tone: 1, size: shadeEvery && n % shadeEvery === 3 ? 80 : 6, pen: true, points: Array.from({ length: 100 }, (_, i) => [500 + i * 5 + n % 50, 500 + n / 2 + Math.sin(i / 5) * 30, 0.5]).flat() })) as never
  for (const edge of [2048, 256]) {
    const t = performance.now()
    paintPixels(strokes, edge, 2048)
    console.log(shadeEvery, edge, Math.round(performance.now() - t))
  }
}

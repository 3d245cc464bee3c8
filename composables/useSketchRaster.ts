import { SKETCH_SIZE } from '#shared/sketch/frame'
import { RASTER_PALETTE, paintStrokes } from '#shared/sketch/paint'
import type { Stroke } from '#shared/sketch/schema'

/**
 * The image uploaded with each save: the drawing alone (never the guide), one pixel per sketch unit, grey on
 * black. Painted with the same painter as the screen, so the two agree.
 */
export async function renderSketchRaster(strokes: readonly Stroke[]): Promise<Blob> {
  const canvas = document.createElement('canvas')
  canvas.width = SKETCH_SIZE
  canvas.height = SKETCH_SIZE
  const ctx = canvas.getContext('2d')
  if (!ctx) throw new Error('This browser cannot draw the sketch image.')
  paintStrokes(ctx, strokes, RASTER_PALETTE)
  // The paper goes in behind the strokes last, so the eraser's cut-outs show it too.
  ctx.globalCompositeOperation = 'destination-over'
  ctx.fillStyle = '#000'
  ctx.fillRect(0, 0, SKETCH_SIZE, SKETCH_SIZE)
  return new Promise((resolve, reject) => {
    canvas.toBlob(blob => (blob ? resolve(blob) : reject(new Error('The sketch image could not be made.'))), 'image/png')
  })
}

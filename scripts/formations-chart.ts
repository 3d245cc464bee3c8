// Draws every reference formation over the computed disk (mean libration, full moon, north up, lunar east
// to the right) as an SVG rendered to PNG, to check the data by eye: each name must sit on its place.
//   npx tsx scripts/formations-chart.ts [out.png]

import sharp from 'sharp'
import { REFERENCE_FORMATIONS } from '../db/data/formations'
import { projectFormation } from '../shared/features/formations'

const SIZE = 2400
const R = 1150
const C = SIZE / 2
const geometry = { illuminatedFraction: 1, brightLimbAngleDeg: 0, parallacticAngleDeg: 0, axisAngleDeg: 0, librationLonDeg: 0, librationLatDeg: 0 }
const escape = (s: string) => s.replace(/&/g, '&amp;').replace(/</g, '&lt;')

const seas = new Set(['oceanus', 'mare', 'sinus', 'lacus', 'palus'])
const parts: string[] = [`<rect width="${SIZE}" height="${SIZE}" fill="#0b0d12"/>`, `<circle cx="${C}" cy="${C}" r="${R}" fill="#c9c6bd"/>`]
for (const f of REFERENCE_FORMATIONS) {
  const p = projectFormation(f, geometry, { orientation: 'north-up', flip: 'none' })
  if (!p) continue
  const x = C + p.x * R
  const y = C - p.y * R
  const ellipse = `cx="${x}" cy="${y}" rx="${p.radial * R}" ry="${p.across * R}" transform="rotate(${-p.angleDeg} ${x} ${y})"`
  parts.push(seas.has(f.kind)
    ? `<ellipse ${ellipse} fill="#6f7480" fill-opacity="0.45" stroke="#3b3f48"/>`
    : `<ellipse ${ellipse} fill="none" stroke="${f.kind === 'crater' ? '#7a2f2f' : '#2f5a7a'}" stroke-width="2"/>`)
}
for (const f of REFERENCE_FORMATIONS) {
  const p = projectFormation(f, geometry, { orientation: 'north-up', flip: 'none' })
  if (!p) continue
  const size = seas.has(f.kind) ? 22 : 13
  parts.push(`<text x="${C + p.x * R}" y="${C - p.y * R + size / 3}" font-family="sans-serif" font-size="${size}" text-anchor="middle" fill="${seas.has(f.kind) ? '#0d2a5c' : '#111'}">${escape(f.name)}</text>`)
}
parts.push(`<text x="40" y="60" font-family="sans-serif" font-size="36" fill="#eee">N up · lunar E (Crisium) right · mean libration</text>`)
const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="${SIZE}" height="${SIZE}">${parts.join('')}</svg>`
const out = process.argv[2] ?? 'tests/e2e/artifacts/formations-chart.png'
await sharp(Buffer.from(svg)).png().toFile(out)
console.log(`wrote ${out}`)

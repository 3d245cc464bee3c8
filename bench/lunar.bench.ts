// Benchmark of lunarCircumstances against the bare astronomy-engine calls it makes for the same instants.
// A script, not a test: timings vary with the machine and never gate anything.
//   npm run bench:lunar       → prints the figures and writes bench/results/lunar.json

import { mkdirSync, readFileSync, writeFileSync } from 'node:fs'
import { cpus, platform, release } from 'node:os'
import {
  AstroTime,
  Body,
  GeoMoon,
  GeoVector,
  Horizon,
  MakeTime,
  Observer,
  ObserverVector,
  RotateVector,
  Rotation_EQJ_ECT,
  Rotation_EQJ_EQD,
  RotationAxis,
  SearchMoonPhase,
  SiderealTime,
  Vector,
} from 'astronomy-engine'
import { lunarCircumstances } from '../shared/lunar/index'
import { resetPhaseCache } from '../shared/lunar/phases'

const INSTANTS = 10_000
const COLD_INSTANTS = 1_000
const RUNS = 7
const SITE = { latitude: 51.5, longitude: -0.1, elevation: 30 }

// The module's mean-lunation bookkeeping (Meeus eq. 49.1), needed so the bare loop makes the same phase
// searches the module makes: one per new moon it has not met yet, from the same window.
const MEAN_NEW_MOON_TT = 5.09766
const SYNODIC_MONTH_DAYS = 29.530588861
const PHASE_TARGET = 360 - 19.79 / 3600

function bareNewMoonMs(k: number, seen: Map<number, number>): number {
  const known = seen.get(k)
  if (known !== undefined) return known
  const start = AstroTime.FromTerrestrialTime(MEAN_NEW_MOON_TT + SYNODIC_MONTH_DAYS * k - 1.5)
  const ms = SearchMoonPhase(PHASE_TARGET, start, 3)!.date.getTime()
  seen.set(k, ms)
  return ms
}

/** The library calls lunarCircumstances makes for one instant, without validation, wrapping or assembly. */
function bareCalls(at: Date, observer: Observer, seen: Map<number, number>): void {
  const time = MakeTime(at)
  const toDate = Rotation_EQJ_EQD(time)
  const moon = GeoMoon(time)
  const sun = GeoVector(Body.Sun, time, true)
  const site = ObserverVector(time, observer, false)
  const moonTopo = RotateVector(toDate, new Vector(moon.x - site.x, moon.y - site.y, moon.z - site.z, time))
  RotateVector(toDate, new Vector(sun.x - site.x, sun.y - site.y, sun.z - site.z, time))
  // The module rotates the pole and its prime-meridian vector to the equator of date.
  const axis = RotationAxis(Body.Moon, time)
  RotateVector(toDate, axis.north)
  RotateVector(toDate, new Vector(-axis.north.y, axis.north.x, 0, time))
  const ra = Math.atan2(moonTopo.y, moonTopo.x) * 12 / Math.PI
  const dec = Math.atan2(moonTopo.z, Math.hypot(moonTopo.x, moonTopo.y)) * 180 / Math.PI
  Horizon(time, observer, ra < 0 ? ra + 24 : ra, dec, 'normal')
  const toEcliptic = Rotation_EQJ_ECT(time)
  RotateVector(toEcliptic, moon)
  RotateVector(toEcliptic, sun)
  // Same search decisions as lunationBounds: the new moon at or before the instant and the one after.
  const ms = at.getTime()
  let k = Math.floor((time.tt - MEAN_NEW_MOON_TT) / SYNODIC_MONTH_DAYS)
  while (bareNewMoonMs(k, seen) > ms) k -= 1
  while (bareNewMoonMs(k + 1, seen) <= ms) k += 1
  SiderealTime(time)
}

interface Timing {
  oursUs: number
  bareUs: number
}

function timeRun(instants: Date[], resetEachCall: boolean): Timing {
  const observer = new Observer(SITE.latitude, SITE.longitude, SITE.elevation)
  resetPhaseCache()
  let t0 = performance.now()
  for (const at of instants) {
    if (resetEachCall) resetPhaseCache()
    lunarCircumstances(at, SITE)
  }
  const ours = performance.now() - t0
  let seen = new Map<number, number>()
  t0 = performance.now()
  for (const at of instants) {
    if (resetEachCall) seen = new Map()
    bareCalls(at, observer, seen)
  }
  const bare = performance.now() - t0
  return { oursUs: (ours * 1000) / instants.length, bareUs: (bare * 1000) / instants.length }
}

const median = (values: number[]): number => {
  const sorted = [...values].sort((a, b) => a - b)
  const mid = sorted.length >> 1
  return sorted.length % 2 ? sorted[mid]! : (sorted[mid - 1]! + sorted[mid]!) / 2
}

function scenario(name: string, instants: Date[], resetEachCall: boolean) {
  timeRun(instants.slice(0, 200), resetEachCall) // warm the JIT
  const runs = Array.from({ length: RUNS }, () => timeRun(instants, resetEachCall))
  const oursUs = median(runs.map(r => r.oursUs))
  const bareUs = median(runs.map(r => r.bareUs))
  const ratio = median(runs.map(r => r.oursUs / r.bareUs))
  console.log(`${name.padEnd(14)} ours ${oursUs.toFixed(1).padStart(7)} µs/call   bare library ${bareUs.toFixed(1).padStart(7)} µs/call   ratio ${ratio.toFixed(3)}`)
  return { instants: instants.length, runs: RUNS, medianMicrosecondsPerCall: { ours: oursUs, bareLibrary: bareUs }, medianRatio: ratio, runsMicrosecondsPerCall: runs }
}

// A campaign-like sequence: hourly instants through 2026 and into 2027 (about 14 lunations), the phase
// cache emptied at the start of each run so every run pays the same ~15 searches.
const start = Date.UTC(2026, 0, 1)
const sequence = Array.from({ length: INSTANTS }, (_, i) => new Date(start + i * 3_600_000))
// The worst case: every call in a lunation not seen before, so every call searches for its new moons.
const cold = Array.from({ length: COLD_INSTANTS }, (_, i) => new Date(Date.UTC(1950, 0, 1) + i * 31.7 * 86_400_000))

const cpu = cpus()
const machine = {
  cpu: cpu[0]?.model ?? 'unknown',
  cores: cpu.length,
  node: process.version,
  os: `${platform()} ${release()}`,
}
const library = JSON.parse(readFileSync('node_modules/astronomy-engine/package.json', 'utf8')).version as string
console.log(`lunarCircumstances benchmark — ${machine.cpu}, ${machine.cores} cores, Node ${machine.node}, astronomy-engine ${library}`)
const warm = scenario('sequence', sequence, false)
const coldResult = scenario('cold lunation', cold, true)

const result = {
  generatedAt: new Date().toISOString(),
  machine,
  library: { 'astronomy-engine': library },
  ratios: { vsBareLibrary: warm.medianRatio, vsBareLibraryColdLunation: coldResult.medianRatio },
  perCallMicroseconds: { ours: warm.medianMicrosecondsPerCall.ours, oursColdLunation: coldResult.medianMicrosecondsPerCall.ours },
  scenarios: {
    sequence: { description: 'hourly instants from 2026-01-01, phase cache emptied per run', ...warm },
    coldLunation: { description: 'every call in an unseen lunation (phase cache emptied per call)', ...coldResult },
  },
}
mkdirSync('bench/results', { recursive: true })
writeFileSync('bench/results/lunar.json', `${JSON.stringify(result, null, 2)}\n`)
console.log(`vsBareLibrary ${result.ratios.vsBareLibrary.toFixed(3)} (cold lunation ${result.ratios.vsBareLibraryColdLunation.toFixed(3)}); written bench/results/lunar.json`)

import { stringify } from 'csv-stringify/sync'
import type { ObservationDto } from './observations'

const round = (x: number | null | undefined, places = 2) => (x == null ? '' : x.toFixed(places))

/** Column name → value; the order here is the order in the file. */
const COLUMNS: [string, (o: ObservationDto & { latitude: number, longitude: number, elevation: number }) => string | number][] = [
  ['observed_at_utc', o => o.observedAt],
  ['local_date', o => o.localDate],
  ['local_time', o => o.localTime],
  ['time_zone', o => o.timeZone],
  ['site', o => o.site.name],
  ['latitude_deg', o => o.latitude],
  ['longitude_deg', o => o.longitude],
  ['elevation_m', o => o.elevation],
  ['instrument', o => o.instrumentLabel],
  ['magnification', o => round(o.magnification, 1)],
  ['view', o => o.view],
  ['seeing_antoniadi', o => o.seeing ?? ''],
  ['transparency', o => o.transparency ?? ''],
  ['illuminated_fraction', o => round(o.circumstances.illuminatedFraction, 4)],
  ['age_days', o => round(o.circumstances.ageDays)],
  ['phase', o => o.circumstances.phaseName],
  ['colongitude_deg', o => round(o.circumstances.colongitudeDeg)],
  ['libration_lon_deg', o => round(o.circumstances.librationLonDeg)],
  ['libration_lat_deg', o => round(o.circumstances.librationLatDeg)],
  ['moon_altitude_predicted_deg', o => round(o.circumstances.altitudeDeg)],
  ['moon_azimuth_predicted_deg', o => round(o.circumstances.azimuthDeg)],
  ['clinometer_reading_deg', o => round(o.altitude?.rawDeg, 1)],
  ['altitude_measured_deg', o => round(o.altitude?.derivedDeg, 1)],
  ['altitude_residual_deg', o => round(o.altitude?.residualDeg)],
  ['compass_bearing_deg', o => round(o.azimuth?.rawDeg, 1)],
  ['magnetic_declination_deg', o => round(o.azimuth?.declinationDeg)],
  ['azimuth_true_deg', o => round(o.azimuth?.derivedDeg, 1)],
  ['azimuth_residual_deg', o => round(o.azimuth?.residualDeg)],
  ['moonrise_utc', o => o.circumstances.moon.rise ?? ''],
  ['moon_transit_utc', o => o.circumstances.moon.transit ?? ''],
  ['moonset_utc', o => o.circumstances.moon.set ?? ''],
  ['sunrise_utc', o => o.circumstances.sun.rise ?? ''],
  ['sunset_utc', o => o.circumstances.sun.set ?? ''],
  ['notes', o => o.notes],
]

export const CSV_COLUMNS = COLUMNS.map(([name]) => name)

export function observationsCsv(rows: (ObservationDto & { latitude: number, longitude: number, elevation: number })[]): string {
  return stringify([CSV_COLUMNS, ...rows.map(row => COLUMNS.map(([, value]) => value(row)))])
}

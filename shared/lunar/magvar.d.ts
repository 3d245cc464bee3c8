// Types for the parts of the magvar package (World Magnetic Model 2025) this module calls; it ships none.
declare module 'magvar' {
  /** Declination in degrees, east positive, rounded to 0.01°. `when` is a decimal year or a Date (read as UTC). */
  export function magvar(latitude: number, longitude: number, altitudeKm?: number, when?: number | Date): number
  export const MODEL_EPOCH: number
  export const MODEL_VALID_UNTIL: number
}

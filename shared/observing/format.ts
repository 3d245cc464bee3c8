// How angles read on every page: one decimal, a real minus sign for negative residuals, a dash when absent.

export function formatDegrees(x: number | null | undefined, places = 1): string {
  return x == null ? '—' : `${x.toFixed(places)}°`
}

export function formatSigned(x: number | null | undefined): string {
  return x == null ? '—' : `${x >= 0 ? '+' : '−'}${Math.abs(x).toFixed(1)}°`
}

// What is wrong with the atlas filters, in the filter panel's own words, before the server is asked.

type Query = Record<string, unknown>

const text = (q: Query, key: string) => (typeof q[key] === 'string' && q[key] !== '' ? q[key] as string : null)
const num = (q: Query, key: string) => (text(q, key) === null ? null : Number(text(q, key)))

export function atlasFilterProblems(query: Query): string[] {
  const problems: string[] = []
  const outside = (v: number | null, lo: number, hi: number) => v !== null && !(v >= lo && v <= hi)
  if (outside(num(query, 'colongitudeMin'), 0, 360) || outside(num(query, 'colongitudeMax'), 0, 360)) {
    problems.push('Colongitude runs from 0° to 360°; enter both ends of the range within it (350 to 10 wraps through 0°).')
  }
  const ageMin = num(query, 'ageMin')
  const ageMax = num(query, 'ageMax')
  if (outside(ageMin, 0, 30) || outside(ageMax, 0, 30)) problems.push('The Moon\'s age runs from 0 to 30 days.')
  else if (ageMin !== null && ageMax !== null && ageMin > ageMax) problems.push('The youngest age chosen is older than the oldest.')
  const from = text(query, 'from')
  const to = text(query, 'to')
  const date = /^\d{4}-\d{2}-\d{2}$/
  if ((from && !date.test(from)) || (to && !date.test(to))) problems.push('Enter the dates as YYYY-MM-DD.')
  else if (from && to && from > to) problems.push('"Observed from" is after "to"; swap the two dates.')
  return problems
}

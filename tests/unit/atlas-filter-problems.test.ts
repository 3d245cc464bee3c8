import { describe, expect, it } from 'vitest'
import { atlasFilterProblems } from '../../utils/atlasFilterProblems'

describe('atlas filter problems in words', () => {
  it('says what is wrong with a bad range, never a field name or an HTTP status', () => {
    const [problem] = atlasFilterProblems({ colongitudeMin: '400', colongitudeMax: '10' })
    expect(problem).toMatch(/Colongitude runs from 0° to 360°/)
    expect(atlasFilterProblems({ ageMin: '20', ageMax: '5' })).toEqual(['The youngest age chosen is older than the oldest.'])
    expect(atlasFilterProblems({ from: '2026-12-01', to: '2026-11-01' })[0]).toMatch(/after "to"/)
    for (const p of atlasFilterProblems({ colongitudeMin: '-5', ageMax: '31', from: 'x' })) expect(p).not.toMatch(/colongitudeMin|ageMax|400|Validation/)
  })

  it('finds nothing wrong with good filters, including a range that wraps through 0°', () => {
    expect(atlasFilterProblems({ colongitudeMin: '350', colongitudeMax: '10', ageMin: '3', ageMax: '9', from: '2026-01-01', to: '2026-12-31' })).toEqual([])
    expect(atlasFilterProblems({})).toEqual([])
  })
})

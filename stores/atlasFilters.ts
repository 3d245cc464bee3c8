import { defineStore } from 'pinia'
import type { LocationQuery } from 'vue-router'

export interface AtlasFilterState {
  phase: string
  ageMin: string
  ageMax: string
  colongitudeMin: string
  colongitudeMax: string
  feature: string
  formation: string
  observer: string
  instrument: string
  from: string
  to: string
  /** The page: the card it continues after or ends before (server/utils/atlas.ts), empty for the first. */
  after: string
  before: string
}

const EMPTY: AtlasFilterState = {
  phase: '', ageMin: '', ageMax: '', colongitudeMin: '', colongitudeMax: '',
  feature: '', formation: '', observer: '', instrument: '', from: '', to: '', after: '', before: '',
}

const PAGE_KEYS = ['after', 'before']

/**
 * The atlas filters. The URL is the source of truth, so a view can be shared and the back button returns
 * to the same page of results; the store mirrors it for the filter controls.
 */
export const useAtlasFilters = defineStore('atlas-filters', () => {
  const state = reactive<AtlasFilterState>({ ...EMPTY })

  function fromQuery(query: LocationQuery) {
    for (const key of Object.keys(EMPTY) as (keyof AtlasFilterState)[]) {
      const value = query[key]
      state[key] = typeof value === 'string' ? value : ''
    }
  }

  /** The query for the URL and the API: empty filters left out. */
  const query = computed(() => {
    const out: Record<string, string> = {}
    for (const [key, value] of Object.entries(state)) {
      if (value !== '') out[key] = value
    }
    return out
  })

  const active = computed(() => Object.keys(query.value).filter(k => !PAGE_KEYS.includes(k)).length)

  function clear() {
    Object.assign(state, EMPTY)
  }

  return { state, query, active, fromQuery, clear }
})

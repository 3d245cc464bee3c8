import { defineStore } from 'pinia'

/** The observation list's filters and sort: client state that survives leaving the page and coming back. */
export const useObservationFilters = defineStore('observation-filters', () => {
  const siteId = ref('')
  const from = ref('')
  const to = ref('')
  const phase = ref('')
  const sort = ref<'observedAt' | 'illuminatedFraction' | 'ageDays' | 'colongitude' | 'site'>('observedAt')
  const dir = ref<'asc' | 'desc'>('desc')
  const page = ref(1)

  const query = computed(() => ({
    siteId: siteId.value || undefined,
    from: from.value || undefined,
    to: to.value || undefined,
    phase: phase.value || undefined,
    sort: sort.value,
    dir: dir.value,
    page: page.value,
  }))

  function sortBy(column: typeof sort.value) {
    if (sort.value === column) dir.value = dir.value === 'asc' ? 'desc' : 'asc'
    else {
      sort.value = column
      dir.value = column === 'site' ? 'asc' : 'desc'
    }
    page.value = 1
  }

  return { siteId, from, to, phase, sort, dir, page, query, sortBy }
})

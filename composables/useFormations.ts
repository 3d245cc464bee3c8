import type { Formation } from '#shared/features/formations'

let loading: Promise<void> | undefined

/**
 * The reference formations, fetched once per visit and shared by every component that shows them (the
 * label layer, suggestions under a pin, the terminator list). They change only with a release.
 */
export function useFormations() {
  const list = useState<Formation[]>('reference-formations', () => [])
  if (import.meta.client && !list.value.length && !loading) {
    loading = $fetch<{ items: Formation[] }>('/api/formations')
      .then((r) => {
        list.value = r.items
      })
      .catch(() => undefined)
      .finally(() => {
        loading = undefined
      })
  }
  return list
}

/** Whether the guide shows the standard names; off by default, so the eyepiece view stays clean. */
export function useFormationLabels() {
  return useState<boolean>('formation-labels', () => false)
}

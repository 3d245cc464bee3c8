import { defineStore } from 'pinia'

const KEY = 'shadowline.display'

interface DisplayPrefs {
  night: boolean
  brightness: number
}

/** Night theme and screen brightness, remembered per device. */
export const useDisplayStore = defineStore('display', () => {
  const night = ref(false)
  const brightness = ref(1)

  function apply() {
    if (!import.meta.client) return
    document.documentElement.classList.toggle('night', night.value)
    document.documentElement.style.setProperty('--night-brightness', String(brightness.value))
    const prefs: DisplayPrefs = { night: night.value, brightness: brightness.value }
    localStorage.setItem(KEY, JSON.stringify(prefs))
  }

  function load() {
    if (!import.meta.client) return
    try {
      const saved = JSON.parse(localStorage.getItem(KEY) ?? '{}') as Partial<DisplayPrefs>
      night.value = saved.night === true
      brightness.value = typeof saved.brightness === 'number' ? Math.min(1, Math.max(0.3, saved.brightness)) : 1
    }
    catch {
      night.value = false
    }
  }

  function toggleNight() {
    night.value = !night.value
    apply()
  }

  function setBrightness(value: number) {
    brightness.value = Math.min(1, Math.max(0.3, value))
    apply()
  }

  return { night, brightness, load, toggleNight, setBrightness }
})

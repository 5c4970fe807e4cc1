import { defineStore } from 'pinia'
import { computed, ref, watch } from 'vue'

/** Light or dark, remembered on this device. */
export const useThemeStore = defineStore('theme', () => {
  const stored = typeof localStorage !== 'undefined' ? localStorage.getItem('lw-theme') : null
  /** 'light' or 'dark'. */
  const mode = ref<'light' | 'dark'>(stored === 'dark' ? 'dark' : 'light')
  /** True in the dark theme. */
  const dark = computed(() => mode.value === 'dark')
  function toggle() {
    mode.value = dark.value ? 'light' : 'dark'
  }
  watch(mode, (m) => localStorage.setItem('lw-theme', m))
  function $reset() {
    mode.value = 'light'
  }
  return { mode, dark, toggle, $reset }
})

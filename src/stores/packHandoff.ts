import { defineStore } from 'pinia'
import { ref } from 'vue'

/** A pack designed on the pack bench, carried to the charger check ("check a charger for this pack"). */
export interface PackHandoff {
  /** The pack inputs as typed on the bench. */
  inputs: Record<string, unknown>
  /** The pack chosen (or checked), Ah, and its cells in series, from the engine's result. */
  capacityAh: number
  cellsInSeries: number
  /** Title of the sheet it came from, if any, for the banner. */
  from?: string
  /** The sheet it came from, if saved: the charger check can be added to it. */
  sheetId?: string
}

export const usePackHandoffStore = defineStore('packHandoff', () => {
  /** The last pack sent from the bench; null when none. */
  const pack = ref<PackHandoff | null>(null)
  function send(next: PackHandoff) {
    pack.value = next
  }
  function $reset() {
    pack.value = null
  }
  return { pack, send, $reset }
})

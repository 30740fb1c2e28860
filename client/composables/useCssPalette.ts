import { useQuasar } from 'quasar'
import { ref, watch, type Ref } from 'vue'

/**
 * Reads colours from CSS variables (a canvas cannot use them directly) and reads them again when dark mode changes.
 * `names` maps a key to a variable, e.g. { bar: '--q-primary' }.
 */
export function useCssPalette<K extends string>(names: Record<K, string>): Ref<Record<K, string>> {
  const $q = useQuasar()
  const read = () => {
    const style = getComputedStyle(document.body)
    return Object.fromEntries(Object.entries<string>(names).map(([k, v]) => [k, style.getPropertyValue(v).trim()])) as Record<K, string>
  }
  const palette = ref(read()) as Ref<Record<K, string>>
  watch(() => $q.dark.isActive, () => (palette.value = read()), { flush: 'post' })
  return palette
}

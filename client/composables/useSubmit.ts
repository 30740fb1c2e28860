import { ref } from 'vue'
import { errorText } from '@/utils/errorText'

/** One form submission at a time, with its busy flag and a plain error message. */
export function useSubmit() {
  const busy = ref(false)
  const error = ref('')
  async function run(action: () => Promise<void>): Promise<void> {
    error.value = ''
    busy.value = true
    try {
      await action()
    } catch (err) {
      error.value = errorText(err)
    } finally {
      busy.value = false
    }
  }
  return { busy, error, run }
}

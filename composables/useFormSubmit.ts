/** State for one form's submission: busy flag, field messages and the overall message. */
export function useFormSubmit() {
  const busy = ref(false)
  const error = ref('')
  const fields = ref<Record<string, string>>({})

  async function run<T>(task: () => Promise<T>): Promise<T | undefined> {
    busy.value = true
    error.value = ''
    fields.value = {}
    try {
      return await task()
    }
    catch (failure) {
      error.value = apiErrorMessage(failure)
      fields.value = apiFieldErrors(failure)
      return undefined
    }
    finally {
      busy.value = false
    }
  }

  return { busy, error, fields, run }
}

import { ref, shallowRef } from 'vue';
import { asApiError, type ApiError } from '@/api/http';

/**
 * Loading and error state for one page's data. A 401 needs nothing here: the HTTP wrapper
 * reports it to the auth store, and the router leaves the page.
 */
export function useAsyncData<T>(load: () => Promise<T>) {
  const data = shallowRef<T | null>(null);
  const error = ref<ApiError | null>(null);
  const loading = ref(false);

  async function reload(): Promise<void> {
    loading.value = true;
    error.value = null;
    try {
      data.value = await load();
    } catch (caught) {
      error.value = asApiError(caught);
    } finally {
      loading.value = false;
    }
  }

  void reload();
  return { data, error, loading, reload };
}

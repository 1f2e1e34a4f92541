// Owns the loading flag and the error of one asynchronous task, so pages never
// juggle them by hand. Only the latest call's result is kept.
import { ref, shallowRef, type Ref, type ShallowRef } from 'vue';
import { toApiError, type ApiError } from '@/api/errors';

export interface AsyncTask<T, A extends unknown[]> {
  data: ShallowRef<T | null>;
  loading: Ref<boolean>;
  error: ShallowRef<ApiError | null>;
  run: (...args: A) => Promise<T | null>;
}

export function useAsync<T, A extends unknown[]>(task: (...args: A) => Promise<T>): AsyncTask<T, A> {
  const data = shallowRef<T | null>(null);
  const loading = ref(false);
  const error = shallowRef<ApiError | null>(null);
  let latest = 0;

  async function run(...args: A): Promise<T | null> {
    const call = ++latest;
    loading.value = true;
    error.value = null;
    try {
      const value = await task(...args);
      if (call === latest) data.value = value;
      return value;
    } catch (cause) {
      if (call === latest) error.value = toApiError(cause);
      return null;
    } finally {
      if (call === latest) loading.value = false;
    }
  }

  return { data, loading, error, run };
}

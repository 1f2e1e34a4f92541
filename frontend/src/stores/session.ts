// Who is signed in, as the server says. The UI only displays this; the server
// checks the role on every route.
import { defineStore } from 'pinia';
import { computed, ref, shallowRef } from 'vue';
import { fetchCurrentUser, signOut as endSession, type SessionUser } from '@/api/auth';
import { toApiError, type ApiError } from '@/api/errors';

export type SessionState = 'unknown' | 'signed-in' | 'anonymous';

export const useSessionStore = defineStore('session', () => {
  const user = ref<SessionUser | null>(null);
  const checked = ref(false);
  const error = shallowRef<ApiError | null>(null);

  const state = computed<SessionState>(() => {
    if (user.value) return 'signed-in';
    return checked.value ? 'anonymous' : 'unknown';
  });

  async function refresh(): Promise<void> {
    try {
      user.value = await fetchCurrentUser();
      error.value = null;
    } catch (cause) {
      user.value = null;
      error.value = toApiError(cause);
    } finally {
      checked.value = true;
    }
  }

  /** Called when the server answers 401: the session has ended. */
  function forget(): void {
    user.value = null;
    checked.value = true;
  }

  async function signOut(): Promise<void> {
    await endSession();
    forget();
  }

  return { user, state, error, refresh, forget, signOut };
});

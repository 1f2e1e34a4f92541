// The server's own health, polled so the top bar notices when the database or
// the server goes away.
import { defineStore } from 'pinia';
import { computed, ref, shallowRef } from 'vue';
import { fetchHealth, type HealthReport } from '@/api/health';
import { toApiError, type ApiError } from '@/api/errors';

export const HEALTH_POLL_MS = 30_000;

export type HealthState = 'checking' | 'ok' | 'down' | 'no-answer';

export const useHealthStore = defineStore('health', () => {
  const report = shallowRef<HealthReport | null>(null);
  const error = shallowRef<ApiError | null>(null);
  const checkedAt = ref<Date | null>(null);
  let timer: ReturnType<typeof setInterval> | undefined;

  const state = computed<HealthState>(() => {
    if (error.value) return 'no-answer';
    if (!report.value) return 'checking';
    return report.value.status === 'ok' ? 'ok' : 'down';
  });

  async function check(): Promise<void> {
    try {
      report.value = await fetchHealth();
      error.value = null;
    } catch (cause) {
      error.value = toApiError(cause);
    } finally {
      checkedAt.value = new Date();
    }
  }

  function startPolling(): void {
    if (timer !== undefined) return;
    void check();
    timer = setInterval(() => void check(), HEALTH_POLL_MS);
  }

  function stopPolling(): void {
    clearInterval(timer);
    timer = undefined;
  }

  return { report, error, checkedAt, state, check, startPolling, stopPolling };
});

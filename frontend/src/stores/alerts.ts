// The Alerts page's data: live alerts worst first and the quiet windows in
// force or coming, refreshed every half minute so new alerts appear by themselves.
import { defineStore } from 'pinia';
import { ref, shallowRef } from 'vue';
import { acknowledgeAlert, createQuietWindow, endQuietWindow, fetchAlerts, fetchQuietWindows } from '@/api/alerts';
import type { Alert, QuietWindow } from '@brimwatch/api-types';
import type { QuietWindowInput } from '@/api/alerts';
import { toApiError, type ApiError } from '@/api/errors';

export const ALERTS_REFRESH_MS = 30_000;

export const useAlertsStore = defineStore('alerts', () => {
  const alerts = shallowRef<Alert[]>([]);
  const quietWindows = shallowRef<QuietWindow[]>([]);
  const loaded = ref(false);
  const error = shallowRef<ApiError | null>(null);
  let timer: ReturnType<typeof setInterval> | undefined;

  async function load(): Promise<void> {
    try {
      [alerts.value, quietWindows.value] = await Promise.all([fetchAlerts({ state: 'live' }), fetchQuietWindows('active')]);
      error.value = null;
    } catch (cause) {
      error.value = toApiError(cause);
    } finally {
      loaded.value = true;
    }
  }

  /** Throws the server's refusal (e.g. 409: resolved meanwhile) for the form to show. */
  async function acknowledge(id: number, note: string): Promise<void> {
    const { alert } = await acknowledgeAlert(id, note);
    alerts.value = alerts.value.map((a) => (a.id === id ? alert : a));
  }

  async function addQuietWindow(input: QuietWindowInput): Promise<QuietWindow> {
    const made = await createQuietWindow(input);
    await load();
    return made;
  }

  async function endWindow(id: number): Promise<void> {
    await endQuietWindow(id);
    await load();
  }

  function startRefreshing(): void {
    if (timer === undefined) timer = setInterval(() => void load(), ALERTS_REFRESH_MS);
  }

  function stopRefreshing(): void {
    clearInterval(timer);
    timer = undefined;
  }

  return { alerts, quietWindows, loaded, error, load, acknowledge, addQuietWindow, endWindow, startRefreshing, stopRefreshing };
});

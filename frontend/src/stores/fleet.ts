// The fleet table: one page of sketches, worst first, and the summary above it.
// The page sets the filters from the address bar; the store fetches and keeps
// refreshing them, so the table stays current without losing the user's view.
import { defineStore } from 'pinia';
import { ref, shallowRef } from 'vue';
import { fetchFleet } from '@/api/sketches';
import type { FleetPage } from '@brimwatch/api-types';
import { toApiError, type ApiError } from '@/api/errors';
import { apiQueryFromFilters, DEFAULT_FILTERS, type FleetFilters } from '@/components/fleet/fleet-query';

export const FLEET_REFRESH_MS = 15_000;

export const useFleetStore = defineStore('fleet', () => {
  const filters = ref<FleetFilters>({ ...DEFAULT_FILTERS });
  const page = shallowRef<FleetPage | null>(null);
  const loading = ref(false);
  const error = shallowRef<ApiError | null>(null);
  const loadedAt = ref<Date | null>(null);
  let inFlight: AbortController | null = null;
  let timer: ReturnType<typeof setInterval> | undefined;

  /** A quiet load (the timer's) keeps the table on screen instead of showing the loading state. */
  async function load(options: { quiet?: boolean } = {}): Promise<void> {
    inFlight?.abort();
    const controller = new AbortController();
    inFlight = controller;
    if (!options.quiet) loading.value = true;
    try {
      page.value = await fetchFleet(apiQueryFromFilters(filters.value), controller.signal);
      error.value = null;
      loadedAt.value = new Date();
    } catch (cause) {
      if (controller.signal.aborted) return;
      error.value = toApiError(cause);
    } finally {
      if (inFlight === controller) {
        loading.value = false;
        inFlight = null;
      }
    }
  }

  function show(next: FleetFilters): Promise<void> {
    filters.value = next;
    return load();
  }

  function startRefreshing(): void {
    if (timer !== undefined) return;
    timer = setInterval(() => {
      if (!inFlight) void load({ quiet: true });
    }, FLEET_REFRESH_MS);
  }

  function stopRefreshing(): void {
    clearInterval(timer);
    timer = undefined;
    inFlight?.abort();
  }

  return { filters, page, loading, error, loadedAt, load, show, startRefreshing, stopRefreshing };
});

// One sketch: its settings and latest figures, and its readings over the
// chosen range, of all its instances or of one. Loading another sketch, range
// or instance drops the answer of the last.
import { defineStore } from 'pinia';
import { ref, shallowRef } from 'vue';
import { fetchReadings, fetchSketch } from '@/api/sketches';
import type { SketchDetail, SketchHistory } from '@brimwatch/api-types';
import { toApiError, type ApiError } from '@/api/errors';

export const RANGES = [
  { key: '6h', label: '6 h', hours: 6 },
  { key: '24h', label: '24 h', hours: 24 },
  { key: '7d', label: '7 d', hours: 24 * 7 },
  { key: '30d', label: '30 d', hours: 24 * 30 },
  { key: '90d', label: '90 d', hours: 24 * 90 },
] as const;

export type RangeKey = (typeof RANGES)[number]['key'];
export const DEFAULT_RANGE: RangeKey = '7d';
/** Enough points for a chart the width of a laptop screen, few enough to move quickly. */
const CHART_POINTS = 600;

export const useSketchStore = defineStore('sketch', () => {
  const id = ref<number | null>(null);
  const detail = shallowRef<SketchDetail | null>(null);
  const history = shallowRef<SketchHistory | null>(null);
  const range = ref<RangeKey>(DEFAULT_RANGE);
  /** The one instance the charts show, or null for all of them. */
  const instance = ref<string | null>(null);
  const loading = ref(false);
  const historyLoading = ref(false);
  const error = shallowRef<ApiError | null>(null);
  const historyError = shallowRef<ApiError | null>(null);
  let detailCall: AbortController | null = null;
  let historyCall: AbortController | null = null;

  async function loadDetail(sketchId: number): Promise<void> {
    detailCall?.abort();
    const call = (detailCall = new AbortController());
    if (id.value !== sketchId) {
      detail.value = null;
      history.value = null;
      instance.value = null;
    }
    id.value = sketchId;
    loading.value = true;
    try {
      detail.value = await fetchSketch(sketchId, call.signal);
      error.value = null;
    } catch (cause) {
      if (!call.signal.aborted) error.value = toApiError(cause);
    } finally {
      if (detailCall === call) loading.value = false;
    }
  }

  async function loadHistory(): Promise<void> {
    if (id.value === null) return;
    historyCall?.abort();
    const call = (historyCall = new AbortController());
    const hours = RANGES.find((r) => r.key === range.value)?.hours ?? 24 * 7;
    const to = new Date();
    const from = new Date(to.getTime() - hours * 3_600_000);
    historyLoading.value = true;
    try {
      history.value = await fetchReadings(id.value, { from, to, points: CHART_POINTS, instance: instance.value }, call.signal);
      historyError.value = null;
    } catch (cause) {
      if (!call.signal.aborted) historyError.value = toApiError(cause);
    } finally {
      if (historyCall === call) historyLoading.value = false;
    }
  }

  /** loadDetail sets the id before its first await, so the history asks for the same sketch. */
  async function open(sketchId: number): Promise<void> {
    await Promise.all([loadDetail(sketchId), loadHistory()]);
  }

  function chooseRange(next: RangeKey): Promise<void> {
    range.value = next;
    return loadHistory();
  }

  function chooseInstance(next: string | null): Promise<void> {
    instance.value = next;
    return loadHistory();
  }

  /** After a change is saved, the answer is the new detail. */
  function replaceDetail(next: SketchDetail): void {
    detail.value = next;
  }

  return { id, detail, history, range, instance, loading, historyLoading, error, historyError, open, loadDetail, loadHistory, chooseRange, chooseInstance, replaceDetail };
});

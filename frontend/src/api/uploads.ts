// The uploads API: counter dump checks and the inventory import.
import type { DumpList, DumpReport, ImportPreview, ImportSummary, InventoryColumn } from '@brimwatch/api-types';
import { get, isApiError } from './client';
import type { ApiError } from './errors';
import { postForm, refusedBody } from './upload-request';

export const INVENTORY_TEMPLATE_URL = '/api/v1/imports/sketches/template';

export function uploadDump(form: FormData, onProgress: (fraction: number) => void): Promise<DumpReport> {
  return postForm<DumpReport>('/api/v1/dumps', form, onProgress);
}

export function fetchDumps(before?: number): Promise<DumpList> {
  return get<DumpList>('/api/v1/dumps', { query: { before, limit: 20 } });
}

export function fetchDump(id: number): Promise<DumpReport> {
  return get<DumpReport>(`/api/v1/dumps/${id}`);
}

export async function fetchInventoryColumns(): Promise<InventoryColumn[]> {
  return (await get<{ columns: InventoryColumn[] }>('/api/v1/imports/sketches/columns')).columns;
}

const fileForm = (file: File) => {
  const form = new FormData();
  form.append('file', file, file.name);
  return form;
};

export function previewInventory(file: File): Promise<ImportPreview> {
  return postForm<ImportPreview>('/api/v1/imports/sketches/preview', fileForm(file));
}

export type ImportOutcome = { imported: true; summary: ImportSummary } | { imported: false; error: ApiError; preview: ImportPreview | null };

/** A refused import is an answer too: it carries the rows and why each one failed. */
export async function importInventory(file: File): Promise<ImportOutcome> {
  try {
    return { imported: true, summary: await postForm<ImportSummary>('/api/v1/imports/sketches', fileForm(file)) };
  } catch (error) {
    if (!isApiError(error)) throw error;
    const body = refusedBody(error) as Partial<ImportPreview> | undefined;
    const preview = body && Array.isArray(body.rows) ? (body as ImportPreview) : null;
    if (!preview && (error.status === 0 || error.status >= 500)) throw error;
    return { imported: false, error, preview };
  }
}

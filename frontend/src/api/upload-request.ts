// Multipart uploads. XMLHttpRequest rather than fetch, because only it reports
// how much of the body has been sent, which the progress bar shows.
import { reportUnauthorized } from './client';
import { ApiError, errorFromBody, networkError } from './errors';

function bodyOf(xhr: XMLHttpRequest): unknown {
  try {
    return JSON.parse(xhr.responseText);
  } catch {
    return null;
  }
}

/** Resolves with the JSON answer; rejects with an ApiError that carries the parsed body for callers that need more than the message. */
export function postForm<T>(path: string, form: FormData, onProgress?: (fraction: number) => void): Promise<T> {
  return new Promise<T>((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', path);
    xhr.setRequestHeader('Accept', 'application/json');
    if (onProgress) {
      xhr.upload.onprogress = (event) => {
        if (event.lengthComputable && event.total > 0) onProgress(event.loaded / event.total);
      };
    }
    xhr.onload = () => {
      const body = bodyOf(xhr);
      if (xhr.status >= 200 && xhr.status < 300) return resolve(body as T);
      if (xhr.status === 401) reportUnauthorized();
      reject(Object.assign(errorFromBody(xhr.status, body), { body }));
    };
    xhr.onerror = () => reject(networkError(new Error('the upload was interrupted')));
    xhr.send(form);
  });
}

/** The JSON body of a refused upload, when the server sent one. */
export function refusedBody(error: unknown): unknown {
  return error instanceof ApiError ? (error as ApiError & { body?: unknown }).body : undefined;
}

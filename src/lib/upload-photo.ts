import { ApiError } from './api-client';

/**
 * Posts one photo (multipart field `photo`) with XMLHttpRequest, because fetch cannot report upload
 * progress. Rejects with the server's error shape as an ApiError (413 too large, 415 not a photo).
 */
export function postPhoto<T>(path: string, file: Blob, name: string, onProgress: (fraction: number) => void, signal?: AbortSignal): Promise<T> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', `/api${path}`);
    xhr.withCredentials = true;
    xhr.setRequestHeader('Accept', 'application/json');
    xhr.upload.onprogress = (e) => {
      if (e.lengthComputable && e.total > 0) onProgress(e.loaded / e.total);
    };
    xhr.onload = () => {
      let data: unknown;
      try {
        data = xhr.responseText ? JSON.parse(xhr.responseText) : undefined;
      } catch {
        data = undefined;
      }
      if (xhr.status >= 200 && xhr.status < 300) {
        onProgress(1);
        resolve(data as T);
        return;
      }
      const err = (data as { error?: { code: string; message: string; fields?: Record<string, string> } })?.error;
      const fallback = xhr.status === 413 ? 'The photo is too large' : xhr.status === 415 ? 'Only JPEG, PNG or WebP photos are taken' : `The server answered ${xhr.status}`;
      reject(new ApiError(xhr.status, err?.code ?? `http_${xhr.status}`, err?.message ?? fallback, err?.fields));
    };
    xhr.onerror = () => reject(new ApiError(0, 'offline', 'No connection to Hoodline; the photo was not sent. Try again when the connection returns.'));
    xhr.onabort = () => reject(new DOMException('Aborted', 'AbortError'));
    signal?.addEventListener('abort', () => xhr.abort());
    const form = new FormData();
    form.append('photo', file, name);
    xhr.send(form);
  });
}

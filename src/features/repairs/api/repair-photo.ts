import { ApiError } from '../../../lib/api-client';

export interface UploadedPhoto {
  id: string;
  thumb: string;
  full: string;
}

/**
 * Sends one repair photo with XMLHttpRequest, because fetch cannot report upload progress.
 * The server files it under the latest repair event of the finding.
 */
export function uploadRepairPhoto(findingId: string, file: Blob, name: string, onProgress: (fraction: number) => void): Promise<UploadedPhoto> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', `/api/findings/${findingId}/repair-photos`);
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
        resolve(data as UploadedPhoto);
        return;
      }
      const err = (data as { error?: { code: string; message: string } })?.error;
      const fallback = xhr.status === 413 ? 'The photo is too large' : xhr.status === 415 ? 'Only JPEG, PNG or WebP photos are taken' : `The server answered ${xhr.status}`;
      reject(new ApiError(xhr.status, err?.code ?? `http_${xhr.status}`, err?.message ?? fallback));
    };
    xhr.onerror = () => reject(new ApiError(0, 'offline', 'No connection to Hoodline; the photo was not sent. Try again when the connection returns.'));
    const form = new FormData();
    form.append('photo', file, name);
    xhr.send(form);
  });
}

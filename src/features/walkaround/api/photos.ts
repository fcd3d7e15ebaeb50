import { postPhoto } from '../../../lib/upload-photo';

export interface UploadedPhoto {
  id: string;
  thumb: string;
  full: string;
  contentType: string;
}

/**
 * Sends one photo with upload progress.
 * Rejects with the server's error shape as an ApiError (413 too large, 415 not a photo).
 */
export const uploadPhoto = (findingId: string, file: Blob, name: string, onProgress: (fraction: number) => void, signal?: AbortSignal): Promise<UploadedPhoto> =>
  postPhoto<UploadedPhoto>(`/findings/${findingId}/photos`, file, name, onProgress, signal);

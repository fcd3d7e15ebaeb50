import { postPhoto } from '../../../lib/upload-photo';

export interface UploadedPhoto {
  id: string;
  thumb: string;
  full: string;
}

/**
 * Sends one repair photo with upload progress.
 * The server files it under the latest repair event of the finding.
 */
export const uploadRepairPhoto = (findingId: string, file: Blob, name: string, onProgress: (fraction: number) => void): Promise<UploadedPhoto> =>
  postPhoto<UploadedPhoto>(`/findings/${findingId}/repair-photos`, file, name, onProgress);

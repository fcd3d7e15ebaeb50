import { randomUUID } from 'node:crypto';
import { fileTypeFromBuffer } from 'file-type';
import multer from 'multer';
import sharp from 'sharp';
import type { Db } from '../../db/client';
import { AppError } from '../../http/errors';
import type { Person } from '../../http/routes';
import { audit } from '../../lib/audit';
import type { PhotoStorage } from '../../storage/storage';
import { walkaroundRepository } from './repository';

export const PHOTO_TYPES = { 'image/jpeg': 'jpg', 'image/png': 'png', 'image/webp': 'webp' } as const;
export const THUMB_PX = 320;

/** Multer keeps the upload in memory: nothing reaches storage until the whole file is in and checked. */
export const photoUpload = (maxBytes: number) =>
  multer({ storage: multer.memoryStorage(), limits: { fileSize: maxBytes, files: 1, fields: 4, fieldSize: 1024, parts: 6 } }).single('photo');

export function photoService(db: Db, storage: PhotoStorage) {
  return {
    /**
     * Stores a photo decided by its bytes, never by its name or declared type. Original and thumbnail go
     * to storage first and the row last; if anything fails the stored objects are removed again.
     */
    async add(person: Person, ip: string, target: { findingId?: string; findingEventId?: string }, file: Express.Multer.File | undefined) {
      if (!file || !file.buffer?.length) throw new AppError('validation', 'Attach a photo in the field "photo"', { photo: 'No file' });
      const kind = await fileTypeFromBuffer(file.buffer);
      if (!kind || !(kind.mime in PHOTO_TYPES)) {
        throw new AppError('unsupported_media_type', `Only JPEG, PNG or WebP photos are taken${kind ? ` (this file is ${kind.mime})` : ''}`);
      }
      let meta: Awaited<ReturnType<ReturnType<typeof sharp>['metadata']>>;
      let thumb: Buffer;
      try {
        const img = sharp(file.buffer, { limitInputPixels: 80_000_000 });
        meta = await img.metadata();
        thumb = await img.rotate().resize(THUMB_PX, THUMB_PX, { fit: 'inside', withoutEnlargement: true }).webp({ quality: 70 }).toBuffer();
      } catch {
        throw new AppError('unsupported_media_type', 'The photo could not be read; it may be damaged');
      }
      const id = randomUUID();
      const ext = PHOTO_TYPES[kind.mime as keyof typeof PHOTO_TYPES];
      const key = `photos/${id.slice(0, 2)}/${id}.${ext}`;
      const thumbKey = `thumbs/${id.slice(0, 2)}/${id}.webp`;
      await storage.put(key, file.buffer, kind.mime);
      try {
        await storage.put(thumbKey, thumb, 'image/webp');
        const row = await db.transaction(async (tx) => {
          const r = await walkaroundRepository(tx).insertPhoto({
            id,
            findingId: target.findingId ?? null,
            findingEventId: target.findingEventId ?? null,
            storageKey: key,
            thumbKey,
            contentType: kind.mime,
            sizeBytes: file.size,
            width: meta.width ?? null,
            height: meta.height ?? null,
            createdBy: person.id,
          });
          await audit(tx, { actorId: person.id, action: 'photo_added', entity: 'photo', entityId: id, ip, details: { ...target, bytes: file.size } });
          return r;
        });
        return { id: row.id, thumb: `/api/photos/${row.id}?size=thumb`, full: `/api/photos/${row.id}`, contentType: row.contentType, width: row.width, height: row.height };
      } catch (e) {
        await storage.delete(key).catch(() => undefined);
        await storage.delete(thumbKey).catch(() => undefined);
        throw e;
      }
    },
    async read(id: string, size: 'full' | 'thumb') {
      const row = await walkaroundRepository(db).photo(id);
      if (!row) return null;
      const key = size === 'thumb' && row.thumbKey ? row.thumbKey : row.storageKey;
      const bytes = await storage.get(key);
      if (!bytes) return null;
      return { bytes, contentType: size === 'thumb' && row.thumbKey ? 'image/webp' : row.contentType };
    },
  };
}

import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import S3rver from 's3rver';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { diskStorage, s3Storage, type PhotoStorage } from '../../server/storage/storage';

// The photo storage interface, against local disk and against a local fake S3 server (s3rver).
const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'hoodline-s3-'));
let server: S3rver;
let s3: PhotoStorage;
beforeAll(async () => {
  server = new S3rver({ port: 0, address: '127.0.0.1', silent: true, directory: dir, configureBuckets: [{ name: 'hoodline-photos', configs: [] }] });
  const addr = (await server.run()) as unknown as { port: number };
  s3 = s3Storage({ endpoint: `http://127.0.0.1:${addr.port}`, region: 'us-east-1', bucket: 'hoodline-photos', accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' });
});
afterAll(async () => {
  await server.close();
  fs.rmSync(dir, { recursive: true, force: true });
});

const drivers = () => [
  ['disk', diskStorage(fs.mkdtempSync(path.join(os.tmpdir(), 'hoodline-disk-')))] as const,
  ['s3', s3] as const,
];

describe('photo storage', () => {
  it('puts, gets and deletes bytes unchanged on both drivers', async () => {
    for (const [name, store] of drivers()) {
      const bytes = Buffer.from(Array.from({ length: 5000 }, (_, i) => i % 251));
      await store.put('photos/ab/abc-123.png', bytes, 'image/png');
      const back = await store.get('photos/ab/abc-123.png');
      expect(back?.equals(bytes), name).toBe(true);
      await store.delete('photos/ab/abc-123.png');
      expect(await store.get('photos/ab/abc-123.png'), name).toBeNull();
      expect(await store.get('photos/never/was.png'), name).toBeNull();
    }
  });

  it('refuses keys that could escape the store', async () => {
    for (const [, store] of drivers()) {
      await expect(store.put('../etc/passwd', Buffer.from('x'), 'image/png')).rejects.toThrow(/unsafe/);
      await expect(store.get('/absolute')).rejects.toThrow(/unsafe/);
    }
  });
});

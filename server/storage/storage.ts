import { DeleteObjectCommand, GetObjectCommand, PutObjectCommand, S3Client } from '@aws-sdk/client-s3';
import fs from 'node:fs/promises';
import path from 'node:path';

/** Where photo bytes live. Keys are ours (uuid-based), never a client's file name. */
export interface PhotoStorage {
  put(key: string, bytes: Buffer, contentType: string): Promise<void>;
  get(key: string): Promise<Buffer | null>;
  delete(key: string): Promise<void>;
}

const SAFE_KEY = /^[a-z0-9][a-z0-9/_.-]{0,200}$/;
function checkKey(key: string) {
  if (!SAFE_KEY.test(key) || key.includes('..')) throw new Error(`unsafe storage key ${JSON.stringify(key)}`);
}

/** Local disk (the default): writes to a temp name and renames, so a crash never leaves half a file under a real key. */
export function diskStorage(root: string): PhotoStorage {
  const full = (key: string) => {
    checkKey(key);
    return path.join(root, key);
  };
  return {
    async put(key, bytes) {
      const p = full(key);
      await fs.mkdir(path.dirname(p), { recursive: true });
      const tmp = `${p}.${process.pid}.${Date.now()}.part`;
      await fs.writeFile(tmp, bytes);
      await fs.rename(tmp, p);
    },
    async get(key) {
      try {
        return await fs.readFile(full(key));
      } catch (e) {
        if ((e as NodeJS.ErrnoException).code === 'ENOENT') return null;
        throw e;
      }
    },
    async delete(key) {
      await fs.rm(full(key), { force: true });
    },
  };
}

/** S3-compatible object storage (AWS S3, MinIO, Ceph ...), for several app servers sharing photos. */
export function s3Storage(opts: { endpoint?: string; region: string; bucket: string; accessKeyId?: string; secretAccessKey?: string }): PhotoStorage {
  const client = new S3Client({
    region: opts.region,
    endpoint: opts.endpoint,
    forcePathStyle: !!opts.endpoint,
    credentials: opts.accessKeyId ? { accessKeyId: opts.accessKeyId, secretAccessKey: opts.secretAccessKey ?? '' } : undefined,
  });
  return {
    async put(key, bytes, contentType) {
      checkKey(key);
      await client.send(new PutObjectCommand({ Bucket: opts.bucket, Key: key, Body: bytes, ContentType: contentType }));
    },
    async get(key) {
      checkKey(key);
      try {
        const r = await client.send(new GetObjectCommand({ Bucket: opts.bucket, Key: key }));
        return Buffer.from(await r.Body!.transformToByteArray());
      } catch (e) {
        if ((e as { name?: string }).name === 'NoSuchKey') return null;
        throw e;
      }
    },
    async delete(key) {
      checkKey(key);
      await client.send(new DeleteObjectCommand({ Bucket: opts.bucket, Key: key }));
    },
  };
}

/**
 * The content-addressed file store: each file lives at `<dir>/<first two hex>/<sha256>`, written
 * to `<dir>/tmp/…` first and renamed into place only when complete, so a crash or a failed
 * request never leaves a partial file under a real name. Equal content is stored once.
 */
import { createHash, randomBytes } from 'node:crypto';
import { createReadStream, existsSync, mkdirSync, type ReadStream } from 'node:fs';
import { rename, rm, writeFile } from 'node:fs/promises';
import { join } from 'node:path';

export interface StoredBlob {
  sha256: string;
  size: number;
  /** False when the same content was already stored. */
  created: boolean;
}

export interface BlobStore {
  readonly dir: string;
  put(data: Buffer): Promise<StoredBlob>;
  has(sha256: string): boolean;
  open(sha256: string): ReadStream;
  /** Removes a stored file (used to undo files a failed request created). */
  remove(sha256: string): Promise<void>;
}

export const sha256Of = (data: Buffer): string => createHash('sha256').update(data).digest('hex');

export function createBlobStore(dir: string): BlobStore {
  const tmpDir = join(dir, 'tmp');
  const pathOf = (sha: string) => {
    if (!/^[0-9a-f]{64}$/.test(sha)) throw new Error(`not a sha256: ${sha}`);
    return join(dir, sha.slice(0, 2), sha);
  };
  return {
    dir,
    async put(data) {
      const sha256 = sha256Of(data);
      const target = pathOf(sha256);
      if (existsSync(target)) return { sha256, size: data.length, created: false };
      mkdirSync(tmpDir, { recursive: true });
      mkdirSync(join(dir, sha256.slice(0, 2)), { recursive: true });
      const tmp = join(tmpDir, `${sha256}.${randomBytes(6).toString('hex')}`);
      try {
        await writeFile(tmp, data, { flag: 'wx' });
        await rename(tmp, target);
      } catch (e) {
        await rm(tmp, { force: true });
        throw e;
      }
      return { sha256, size: data.length, created: true };
    },
    has: (sha) => existsSync(pathOf(sha)),
    open: (sha) => createReadStream(pathOf(sha)),
    async remove(sha) {
      await rm(pathOf(sha), { force: true });
    },
  };
}

import { randomUUID } from 'node:crypto';
import { mkdir, readFile, rename, rm, writeFile } from 'node:fs/promises';
import path from 'node:path';
import { assertStorageKey, contentTypeOfKey } from './keys';
import type { Storage } from './types';

/**
 * Photos as files under `root` (DATA_DIR/uploads by default). Writes go to a
 * temporary file first and are renamed into place, so a reader never sees
 * half a photo.
 */
export function createLocalStorage(root: string): Storage {
  const base = path.resolve(root);
  const fileOf = (key: string) => {
    assertStorageKey(key);
    const file = path.resolve(base, key);
    if (!file.startsWith(base + path.sep)) throw new Error('refused storage key outside the upload directory');
    return file;
  };
  return {
    driver: 'local',
    async put(key, body) {
      const file = fileOf(key);
      await mkdir(path.dirname(file), { recursive: true });
      const tmp = `${file}.${randomUUID()}.tmp`;
      await writeFile(tmp, body, { mode: 0o640 });
      await rename(tmp, file);
    },
    async get(key) {
      try {
        return { body: await readFile(fileOf(key)), contentType: contentTypeOfKey(key) };
      } catch (err) {
        if ((err as NodeJS.ErrnoException).code === 'ENOENT') return null;
        throw err;
      }
    },
    async delete(key) {
      await rm(fileOf(key), { force: true });
    },
  };
}

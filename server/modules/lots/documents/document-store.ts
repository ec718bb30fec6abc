import { randomUUID } from 'node:crypto';
import fs from 'node:fs/promises';
import path from 'node:path';

/**
 * Files of lot documents under `<dataDir>/documents` — outside any served folder. A file is
 * written to a temporary name first and then published under its final key with a hard link,
 * which fails if that key exists: a stored document is never replaced.
 */
export class DocumentStore {
  constructor(readonly root: string) {}

  private resolveKey(key: string): string {
    const abs = path.resolve(this.root, key);
    if (!abs.startsWith(path.resolve(this.root) + path.sep)) throw new Error(`storage key escapes the documents folder: ${key}`);
    return abs;
  }

  /** Writes the bytes to a temporary file (flushed to disk) and returns its path. */
  async writeTemp(bytes: Uint8Array): Promise<string> {
    const dir = path.join(this.root, '.incoming');
    await fs.mkdir(dir, { recursive: true });
    const tmp = path.join(dir, `${randomUUID()}.part`);
    const fh = await fs.open(tmp, 'wx', 0o640);
    try {
      await fh.writeFile(bytes);
      await fh.sync();
    } finally {
      await fh.close();
    }
    return tmp;
  }

  /** Publishes a temporary file under `key`; throws (EEXIST) rather than replace a stored file. */
  async publish(tmp: string, key: string): Promise<string> {
    const dest = this.resolveKey(key);
    await fs.mkdir(path.dirname(dest), { recursive: true });
    await fs.link(tmp, dest);
    return dest;
  }

  async remove(file: string): Promise<void> {
    await fs.rm(file, { force: true });
  }

  pathOf(key: string): string {
    return this.resolveKey(key);
  }
}

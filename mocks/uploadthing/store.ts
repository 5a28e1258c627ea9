import { closeSync, createReadStream, fsyncSync, mkdirSync, openSync, readdirSync, readFileSync, renameSync, rmSync, writeSync, type ReadStream } from "node:fs";
import path from "node:path";
import { FILE_KEY } from "./protocol";

export interface StoredFile {
  key: string;
  name: string;
  size: number;
  type: string;
  customId: string | null;
  contentDisposition: string;
  acl: string;
  fileHash: string;
  lastModified: number;
  uploadedAt: number;
}

function writeAtomic(file: string, data: Buffer | string): void {
  const tmp = `${file}.${process.pid}.tmp`;
  const fd = openSync(tmp, "w");
  try {
    try {
      const buf = typeof data === "string" ? Buffer.from(data) : data;
      // writeSync may write less than asked (a nearly full disk); the next call then fails.
      for (let off = 0; off < buf.length; ) off += writeSync(fd, buf, off, buf.length - off);
      fsyncSync(fd);
    } finally {
      closeSync(fd);
    }
    renameSync(tmp, file);
  } catch (e) {
    // A full or failing disk must not leave a partial file behind to fill it further.
    rmSync(tmp, { force: true });
    throw e;
  }
}

/**
 * Files under `<dataDir>/uploads/<fileKey>` with a `<fileKey>.meta.json` beside each. The bytes
 * are renamed into place first and the metadata second, so a file is only served once complete.
 * Keys are checked against the SDK's key alphabet before any path is built.
 */
export class FileStore {
  readonly dir: string;

  constructor(dataDir: string) {
    this.dir = path.join(path.resolve(dataDir), "uploads");
    mkdirSync(this.dir, { recursive: true });
  }

  private pathOf(key: string): string {
    if (!FILE_KEY.test(key)) throw new Error(`Invalid file key: ${JSON.stringify(key)}`);
    const p = path.join(this.dir, key);
    if (path.dirname(p) !== this.dir) throw new Error("File key escapes the upload folder");
    return p;
  }

  save(key: string, bytes: Buffer, info: Omit<StoredFile, "key" | "size" | "lastModified" | "uploadedAt">): StoredFile {
    const p = this.pathOf(key);
    const meta: StoredFile = { ...info, key, size: bytes.length, lastModified: Date.now(), uploadedAt: Date.now() };
    writeAtomic(p, bytes);
    try {
      writeAtomic(`${p}.meta.json`, JSON.stringify(meta));
    } catch (e) {
      rmSync(p, { force: true });
      throw e;
    }
    return meta;
  }

  meta(key: string): StoredFile | null {
    try {
      return JSON.parse(readFileSync(`${this.pathOf(key)}.meta.json`, "utf8")) as StoredFile;
    } catch {
      return null;
    }
  }

  stream(key: string): ReadStream {
    return createReadStream(this.pathOf(key));
  }

  remove(key: string): boolean {
    const p = this.pathOf(key);
    const existed = this.meta(key) !== null;
    rmSync(`${p}.meta.json`, { force: true });
    rmSync(p, { force: true });
    return existed;
  }

  list(): StoredFile[] {
    return readdirSync(this.dir)
      .filter((f) => f.endsWith(".meta.json"))
      .map((f) => this.meta(f.slice(0, -".meta.json".length)))
      .filter((m): m is StoredFile => m !== null)
      .sort((a, b) => a.uploadedAt - b.uploadedAt);
  }
}

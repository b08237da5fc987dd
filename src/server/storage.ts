import "server-only";
import { mkdir, readFile, rename, rm, writeFile } from "node:fs/promises";
import path from "node:path";
import { env } from "@/env";

/**
 * Where files live (bill uploads, signed documents, photos). The app talks only to this
 * interface; a local-disk driver serves one machine, an object-storage driver serves many
 * app nodes (docs/scaling.md).
 */
export interface FileStorage {
  put(key: string, bytes: Uint8Array): Promise<void>;
  get(key: string): Promise<Uint8Array | null>;
  delete(key: string): Promise<void>;
}

/** Keys are company-scoped paths like `<companyId>/bills/<uuid>.pdf`; nothing else is accepted. */
const KEY = /^[0-9a-f-]{36}(\/[a-z0-9][a-z0-9._-]{0,99}){1,4}$/;

export function assertKey(key: string): void {
  if (!KEY.test(key) || key.includes("..")) throw new Error(`Invalid storage key: ${key}`);
}

export class LocalDiskStorage implements FileStorage {
  constructor(private readonly root: string) {}

  private file(key: string): string {
    assertKey(key);
    return path.join(this.root, key);
  }

  async put(key: string, bytes: Uint8Array): Promise<void> {
    const target = this.file(key);
    await mkdir(path.dirname(target), { recursive: true });
    // Write then rename, so a reader never sees half a file.
    const temp = `${target}.${process.pid}.${Date.now()}.tmp`;
    await writeFile(temp, bytes, { flag: "wx" });
    await rename(temp, target);
  }

  async get(key: string): Promise<Uint8Array | null> {
    try {
      return new Uint8Array(await readFile(this.file(key)));
    } catch (err) {
      if ((err as NodeJS.ErrnoException).code === "ENOENT") return null;
      throw err;
    }
  }

  async delete(key: string): Promise<void> {
    await rm(this.file(key), { force: true });
  }
}

let instance: FileStorage | undefined;
export function storage(): FileStorage {
  instance ??= new LocalDiskStorage(env().STORAGE_DIR);
  return instance;
}

export type PutFile = (key: string, bytes: Uint8Array) => Promise<void>;

/**
 * Runs `work` (which writes files with `put`, then commits its transaction) so that a failure
 * leaves no file behind: when `work` throws — its transaction rolled back — every file it wrote
 * is deleted again. Files cannot take part in the database's transaction; this is the undo.
 */
export async function withFilesUndoneOnFailure<T>(work: (put: PutFile) => Promise<T>): Promise<T> {
  const written: string[] = [];
  try {
    return await work(async (key, bytes) => {
      written.push(key);
      await storage().put(key, bytes);
    });
  } catch (err) {
    for (const key of written) {
      await storage()
        .delete(key)
        .catch((cleanup: unknown) => console.error("could not delete a file written before a rolled-back change", key, cleanup));
    }
    throw err;
  }
}

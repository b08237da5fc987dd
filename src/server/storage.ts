import "server-only";
import { env } from "@/env";
import { storageFromEnv, type FileStorage } from "@/server/file-stores";

export { assertKey, LocalDiskStorage, S3Storage, storageFromEnv, type FileStorage, type S3Settings } from "@/server/file-stores";

let instance: FileStorage | undefined;
export function storage(): FileStorage {
  instance ??= storageFromEnv(env());
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

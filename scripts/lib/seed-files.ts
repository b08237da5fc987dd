// Seeds run in a plain Node script, where the server-only storage module cannot be imported;
// this writes files in the same layout as its local-disk driver: <STORAGE_DIR>/<key>,
// written then renamed.
import { mkdir, rename, writeFile } from "node:fs/promises";
import path from "node:path";

export function seedStorageDir(what: string): string {
  const dir = process.env.STORAGE_DIR;
  if (!dir) throw new Error(`Seeding ${what} needs STORAGE_DIR (the instance's file storage folder) in the environment.`);
  return dir;
}

export async function putSeedFile(storageDir: string, key: string, bytes: Uint8Array): Promise<void> {
  const target = path.join(storageDir, key);
  await mkdir(path.dirname(target), { recursive: true });
  const temp = `${target}.${process.pid}.${Date.now()}.tmp`;
  await writeFile(temp, bytes);
  await rename(temp, target);
}

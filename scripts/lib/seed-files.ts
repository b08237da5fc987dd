// Seeds run in a plain Node script: they write demo files through the app's own file stores
// (local disk or S3-compatible storage, as STORAGE_DRIVER says), so the app reads them back.
import { storageFromEnv, type FileStorage } from "../../src/server/file-stores";

export function seedStore(what: string): FileStorage {
  const e = process.env;
  if (!e.STORAGE_DIR) throw new Error(`Seeding ${what} needs STORAGE_DIR (the instance's file storage folder) in the environment.`);
  const s3 = e.STORAGE_DRIVER === "s3";
  if (s3 && !(e.S3_BUCKET && e.S3_ACCESS_KEY_ID && e.S3_SECRET_ACCESS_KEY)) {
    throw new Error(`Seeding ${what} with STORAGE_DRIVER=s3 needs S3_BUCKET, S3_ACCESS_KEY_ID and S3_SECRET_ACCESS_KEY.`);
  }
  return storageFromEnv({
    STORAGE_DRIVER: s3 ? "s3" : "local",
    STORAGE_DIR: e.STORAGE_DIR,
    S3_ENDPOINT: e.S3_ENDPOINT,
    S3_REGION: e.S3_REGION ?? "us-east-1",
    S3_BUCKET: e.S3_BUCKET,
    S3_ACCESS_KEY_ID: e.S3_ACCESS_KEY_ID,
    S3_SECRET_ACCESS_KEY: e.S3_SECRET_ACCESS_KEY,
  });
}

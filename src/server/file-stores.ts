// The file stores behind storage(): plain Node (no "server-only"), so the seed scripts write
// demo files through the same drivers the app reads them with.
import { mkdir, readFile, rename, rm, writeFile } from "node:fs/promises";
import path from "node:path";
import { DeleteObjectCommand, GetObjectCommand, NoSuchKey, PutObjectCommand, S3Client } from "@aws-sdk/client-s3";
import type { Env } from "@/env";

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

export type S3Settings = { endpoint?: string; region: string; bucket: string; accessKeyId: string; secretAccessKey: string };

/**
 * Files in an S3-compatible object store (AWS S3, or a local S3-compatible server for the
 * cluster), so every app node reads what any node wrote. An object PUT is atomic: a reader sees
 * the old object or the new one, never half of it.
 */
export class S3Storage implements FileStorage {
  private readonly client: S3Client;
  constructor(private readonly settings: S3Settings) {
    this.client = new S3Client({
      region: settings.region,
      endpoint: settings.endpoint,
      // A self-hosted endpoint answers on one host name: buckets go in the path, not the host.
      forcePathStyle: settings.endpoint !== undefined,
      credentials: { accessKeyId: settings.accessKeyId, secretAccessKey: settings.secretAccessKey },
      maxAttempts: 3,
      // Checksums only where S3 requires them: S3-compatible servers do not all read the
      // streamed ("aws-chunked") uploads the SDK sends when it adds checksums by default.
      requestChecksumCalculation: "WHEN_REQUIRED",
      responseChecksumValidation: "WHEN_REQUIRED",
    });
  }

  async put(key: string, bytes: Uint8Array): Promise<void> {
    assertKey(key);
    await this.client.send(new PutObjectCommand({ Bucket: this.settings.bucket, Key: key, Body: bytes }));
  }

  async get(key: string): Promise<Uint8Array | null> {
    assertKey(key);
    try {
      const out = await this.client.send(new GetObjectCommand({ Bucket: this.settings.bucket, Key: key }));
      return out.Body ? await out.Body.transformToByteArray() : new Uint8Array();
    } catch (err) {
      if (err instanceof NoSuchKey || (err as { name?: string }).name === "NotFound") return null;
      throw err;
    }
  }

  async delete(key: string): Promise<void> {
    assertKey(key);
    await this.client.send(new DeleteObjectCommand({ Bucket: this.settings.bucket, Key: key }));
  }
}

/** The store the configuration names (STORAGE_DRIVER): local disk unless `s3`. */
export type StorageConfig = Pick<Env, "STORAGE_DRIVER" | "STORAGE_DIR" | "S3_ENDPOINT" | "S3_REGION" | "S3_BUCKET" | "S3_ACCESS_KEY_ID" | "S3_SECRET_ACCESS_KEY">;

export function storageFromEnv(config: StorageConfig): FileStorage {
  if (config.STORAGE_DRIVER === "local") return new LocalDiskStorage(config.STORAGE_DIR);
  return new S3Storage({
    endpoint: config.S3_ENDPOINT,
    region: config.S3_REGION,
    // Present: the configuration schema requires them when STORAGE_DRIVER is s3.
    bucket: config.S3_BUCKET!,
    accessKeyId: config.S3_ACCESS_KEY_ID!,
    secretAccessKey: config.S3_SECRET_ACCESS_KEY!,
  });
}


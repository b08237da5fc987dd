// The S3 driver against a real S3-compatible server (s3rver, in this process, on loopback):
// the same put / get / delete contract as the local disk, and a missing object reads as null.
import { mkdtemp } from "node:fs/promises";
import { tmpdir } from "node:os";
import path from "node:path";
import S3rver from "s3rver";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { parseEnv } from "@/env";
import { S3Storage, storageFromEnv } from "@/server/storage";

let server: S3rver;
let endpoint = "";

beforeAll(async () => {
  server = new S3rver({
    address: "127.0.0.1",
    port: 0,
    silent: true,
    directory: await mkdtemp(path.join(tmpdir(), "kw-s3-")),
    configureBuckets: [{ name: "kilowright-files", configs: [] }],
  });
  const { port } = (await server.run()) as { port: number };
  endpoint = `http://127.0.0.1:${port}`;
});
afterAll(async () => {
  await server?.close();
});

const settings = () => ({ endpoint, region: "us-east-1", bucket: "kilowright-files", accessKeyId: "S3RVER", secretAccessKey: "S3RVER" });

describe("S3 file storage", () => {
  it("stores, reads back and deletes by company-scoped key; a missing key reads as null", async () => {
    const store = new S3Storage(settings());
    const key = `${crypto.randomUUID()}/bills/${crypto.randomUUID()}.pdf`;
    const bytes = new Uint8Array(300_000).map((_, i) => (i * 7) % 251);
    await store.put(key, bytes);
    expect(await store.get(key)).toEqual(bytes);
    await store.put(key, new TextEncoder().encode("replaced"));
    expect(new TextDecoder().decode((await store.get(key))!)).toBe("replaced");
    await store.delete(key);
    expect(await store.get(key)).toBeNull();
    await store.delete(key); // deleting twice is not an error, as on disk
    await expect(store.put("../../etc/passwd", bytes)).rejects.toThrow("Invalid storage key");
  });

  it("a missing bucket is an error, not an empty read", async () => {
    const store = new S3Storage({ ...settings(), bucket: "no-such-bucket" });
    await expect(store.get(`${crypto.randomUUID()}/bills/x.pdf`)).rejects.toThrow(/bucket/i);
  });

  it("is chosen by STORAGE_DRIVER, and s3 without its settings does not start", () => {
    const base = {
      APP_MODE: "test",
      APP_URL: "http://127.0.0.1:1",
      DATABASE_URL: "mysql://u:p@127.0.0.1:1/kilowright",
      BETTER_AUTH_SECRET: "x".repeat(32),
      RESEND_API_KEY: "re_test",
      MAIL_FROM: "a@b.example",
      STORAGE_DIR: "/tmp/kw",
      STRIPE_SECRET_KEY: "sk_test_x",
      STRIPE_WEBHOOK_SECRET: "whsec_x",
    };
    expect(storageFromEnv(parseEnv(base)).constructor.name).toBe("LocalDiskStorage");
    const s3 = { ...base, STORAGE_DRIVER: "s3", S3_ENDPOINT: endpoint, S3_BUCKET: "kilowright-files", S3_ACCESS_KEY_ID: "S3RVER", S3_SECRET_ACCESS_KEY: "S3RVER" };
    expect(storageFromEnv(parseEnv(s3))).toBeInstanceOf(S3Storage);
    expect(() => parseEnv({ ...base, STORAGE_DRIVER: "s3" })).toThrow(/S3_BUCKET: is required when STORAGE_DRIVER=s3/);
  });
});

import { mkdtemp } from "node:fs/promises";
import { tmpdir } from "node:os";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { LocalDiskStorage } from "@/server/storage";

describe("local-disk file storage", () => {
  it("stores, reads back and deletes by company-scoped key; refuses keys that escape", async () => {
    const store = new LocalDiskStorage(await mkdtemp(path.join(tmpdir(), "kw-storage-")));
    const key = `${crypto.randomUUID()}/bills/${crypto.randomUUID()}.pdf`;
    const bytes = new TextEncoder().encode("%PDF-1.7 test");
    await store.put(key, bytes);
    expect(await store.get(key)).toEqual(bytes);
    await store.delete(key);
    expect(await store.get(key)).toBeNull();
    await expect(store.put("../../etc/passwd", bytes)).rejects.toThrow("Invalid storage key");
    await expect(store.put(`${crypto.randomUUID()}/../x`, bytes)).rejects.toThrow("Invalid storage key");
  });
});

// Every write transaction in the app goes through transaction() (src/server/db.ts), which runs
// it again after a deadlock or a Galera certification conflict; a direct db().transaction()
// would fail the person's request instead whenever the cluster reports a conflict.
import { readdirSync, readFileSync, statSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";

function sources(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const p = path.join(dir, name);
    if (statSync(p).isDirectory()) return sources(p);
    return /\.tsx?$/.test(name) && !name.endsWith(".test.ts") ? [p] : [];
  });
}

describe("write transactions", () => {
  it("use transaction() from src/server/db.ts, never db().transaction() directly", () => {
    const root = path.join(process.cwd(), "src");
    const direct = sources(root)
      .filter((file) => !file.endsWith(path.join("server", "db.ts")))
      .filter((file) => /db\(\)\s*\.transaction\(/.test(readFileSync(file, "utf8")))
      .map((file) => path.relative(process.cwd(), file));
    expect(direct, "replace db().transaction( with transaction( from @/server/db").toEqual([]);
  });
});

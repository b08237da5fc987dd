import { describe, expect, it } from "vitest";
import journal from "../../../drizzle/meta/_journal.json";
import { checkHealth } from "@/server/health";

describe("health", () => {
  it("reports the database reachable and every committed migration applied", async () => {
    const health = await checkHealth();
    expect(health.status).toBe("ok");
    expect(health.database.reachable).toBe(true);
    expect(health.migrations).toMatchObject({ expected: journal.entries.length, applied: journal.entries.length, upToDate: true });
  });
});

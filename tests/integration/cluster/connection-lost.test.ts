// Lost connections against a real MariaDB: another session ends ours with KILL CONNECTION, as
// a killed database node (or the balancer cutting its sessions) ends the app's. A read and a
// transaction whose connection is lost before COMMIT run again on a new connection; a
// transaction whose connection is lost as it commits is not run again.
import { eq, sql } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { company } from "@/db/schema";
import { connectionLost, db, pool, transaction } from "@/server/db";

/** Waits until a statement containing `marker` runs on some connection, then kills that connection once. */
async function killWhenRunning(marker: string): Promise<void> {
  for (let i = 0; i < 200; i++) {
    const [rows] = await pool().query<import("mysql2").RowDataPacket[]>(
      "SELECT ID FROM information_schema.PROCESSLIST WHERE INFO LIKE ? AND INFO NOT LIKE '%PROCESSLIST%'",
      [`%${marker}%`],
    );
    if (rows.length > 0) {
      await pool().query(`KILL CONNECTION ${Number(rows[0].ID)}`);
      return;
    }
    await new Promise((r) => setTimeout(r, 20));
  }
  throw new Error(`no statement with ${marker} ran within 4 s`);
}

describe("a lost connection", () => {
  it("runs a read again on a new connection", async () => {
    const marker = `lost-read-${crypto.randomUUID()}`;
    const killed = killWhenRunning(marker);
    const rows = await db().execute(sql.raw(`SELECT SLEEP(0.5) AS slept, '${marker}' AS marker`));
    await killed;
    expect((rows[0] as unknown as { marker: string }[])[0].marker).toBe(marker);
  });

  it("runs a transaction again when its connection was lost before COMMIT", async () => {
    const marker = `lost-tx-${crypto.randomUUID()}`;
    const id = crypto.randomUUID();
    const killed = killWhenRunning(marker);
    let runs = 0;
    await transaction(async (tx) => {
      runs++;
      await tx.insert(company).values({ id, name: `Lost ${runs}` });
      await tx.execute(sql.raw(`SELECT SLEEP(0.5), '${marker}'`));
    });
    await killed;
    expect(runs).toBe(2);
    // The first attempt's insert died with its connection; the second one's is the row.
    expect((await db().select().from(company).where(eq(company.id, id))).map((r) => r.name)).toEqual(["Lost 2"]);
  });

  it("does not run a transaction again when its connection is lost as it commits", async () => {
    const id = crypto.randomUUID();
    let runs = 0;
    const failure = transaction(async (tx) => {
      runs++;
      await tx.insert(company).values({ id, name: "Committing" });
      const [[{ own }]] = (await tx.execute(sql`SELECT CONNECTION_ID() AS own`)) as unknown as [{ own: number }[]];
      // The work is done; its connection dies before COMMIT reaches the server.
      await pool().query(`KILL CONNECTION ${Number(own)}`);
      await new Promise((r) => setTimeout(r, 100));
    });
    await expect(failure).rejects.toSatisfy(connectionLost);
    expect(runs).toBe(1);
    expect(await db().select().from(company).where(eq(company.id, id))).toEqual([]);
  });

  it("is not retried when the statement writes", async () => {
    const id = crypto.randomUUID();
    const marker = `lost-write-${crypto.randomUUID()}`;
    const killed = killWhenRunning(marker);
    // An INSERT … SELECT that sleeps: the kill lands while it runs; it is not sent again.
    await expect(
      db().execute(sql.raw(`INSERT INTO company (id, name) SELECT '${id}', '${marker}' FROM (SELECT SLEEP(0.5)) AS s`)),
    ).rejects.toSatisfy(connectionLost);
    await killed;
    expect(await db().select().from(company).where(eq(company.id, id))).toEqual([]);
  });
});

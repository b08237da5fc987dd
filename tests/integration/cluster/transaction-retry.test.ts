// The transaction helper against a real MariaDB: a real deadlock (1213, the same error a Galera
// cluster gives for a certification conflict at COMMIT) makes one of two transactions roll back;
// `transaction()` runs the loser again, so both changes land, while a plain Drizzle transaction
// loses one. Other errors are not retried.
import { eq, inArray, sql } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { company } from "@/db/schema";
import { db, mariaDbErrno, transaction, type Tx } from "@/server/db";

/** Two rows, and a barrier so each transaction holds its first row before asking for the other's. */
async function crossLocking(run: (work: (tx: Tx) => Promise<void>) => Promise<void>) {
  const a = crypto.randomUUID();
  const b = crypto.randomUUID();
  await db().insert(company).values([{ id: a, name: "Lock" }, { id: b, name: "Lock" }]);
  let arrived = 0;
  let open: () => void = () => undefined;
  const bothHoldFirstRow = new Promise<void>((r) => (open = r));
  let attempts = 0;
  const worker = (first: string, second: string) => async (tx: Tx) => {
    attempts++;
    await tx.update(company).set({ name: sql`CONCAT(${company.name}, '+')` }).where(eq(company.id, first));
    if (++arrived === 2) open();
    await bothHoldFirstRow;
    await tx.update(company).set({ name: sql`CONCAT(${company.name}, '+')` }).where(eq(company.id, second));
  };
  const results = await Promise.allSettled([run(worker(a, b)), run(worker(b, a))]);
  const rows = await db().select().from(company).where(inArray(company.id, [a, b]));
  return { results, rows, attempts };
}

describe("transaction()", () => {
  it("a plain transaction loses one of two deadlocked writers (the control)", async () => {
    const { results, rows } = await crossLocking((work) => db().transaction(work));
    expect(rows.map((r) => r.name)).toEqual(["Lock+", "Lock+"]); // the loser's change is gone
    const failed = results.filter((r) => r.status === "rejected");
    expect(failed).toHaveLength(1);
    expect(mariaDbErrno((failed[0] as PromiseRejectedResult).reason)).toBe(1213); // ER_LOCK_DEADLOCK
  });

  it("runs the deadlock's loser again, so both writers' changes land", async () => {
    const { results, rows, attempts } = await crossLocking((work) => transaction(work));
    expect(results.map((r) => r.status)).toEqual(["fulfilled", "fulfilled"]);
    expect(attempts).toBe(3); // two first attempts, one rerun
    expect(rows.map((r) => r.name)).toEqual(["Lock++", "Lock++"]); // each row changed by both writers
  });

  // MariaDB 1180 with Galera's "provider status": the COMMIT could not be replicated because
  // the node had just left the primary component (seen in the cluster fault test); Galera
  // commits nothing it could not replicate, so the transaction runs again on a new connection.
  // SIGNAL gives a plain MariaDB the same error number and text.
  const notReplicated = "Error while appending streaming replication fragment(provider status: Not connected to Primary Component)";
  it("runs a transaction again when Galera could not replicate its commit (1180, provider status)", async () => {
    let runs = 0;
    const id = crypto.randomUUID();
    await transaction(async (tx) => {
      runs++;
      await tx.insert(company).values({ id, name: `Replicated ${runs}` });
      if (runs === 1) await tx.execute(sql.raw(`SIGNAL SQLSTATE 'HY000' SET MYSQL_ERRNO = 1180, MESSAGE_TEXT = '${notReplicated}'`));
    });
    expect(runs).toBe(2);
    expect((await db().select().from(company).where(eq(company.id, id))).map((r) => r.name)).toEqual(["Replicated 2"]);
  });

  it("does not retry a 1180 that is not Galera's", async () => {
    let runs = 0;
    await expect(
      transaction(async (tx) => {
        runs++;
        await tx.execute(sql.raw("SIGNAL SQLSTATE 'HY000' SET MYSQL_ERRNO = 1180, MESSAGE_TEXT = 'Got error 1 during COMMIT'"));
      }),
    ).rejects.toSatisfy((e) => mariaDbErrno(e) === 1180);
    expect(runs).toBe(1);
  });

  it("does not retry other errors", async () => {
    let runs = 0;
    const id = crypto.randomUUID();
    await db().insert(company).values({ id, name: "Unique" });
    await expect(
      transaction(async (tx) => {
        runs++;
        await tx.insert(company).values({ id, name: "Again" }); // duplicate primary key: 1062
      }),
    ).rejects.toSatisfy((e) => mariaDbErrno(e) === 1062);
    expect(runs).toBe(1);
  });
});

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

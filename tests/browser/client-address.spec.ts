// The client address comes from the connection (scripts/app-server.ts), not from the caller: a
// forged X-Forwarded-For (or a copy of the app's private header) changes neither the limiter's
// count nor the address kept with a session. The signing certificate: proposal-signing.spec.ts.
import { expect, test } from "@playwright/test";
import { APP_URL, DEMO_PASSWORD, unique, withDb } from "./support";

const forged = (i: number) => ({ Origin: APP_URL, "X-Forwarded-For": `198.51.100.${i}`, "X-Kilowright-Client": `203.0.113.${i}`, "X-Real-IP": `192.0.2.${i}` });

test("a new forged address on every wrong password still meets the limit after 5", async ({ request }) => {
  const email = `${unique("forger")}@nowhere.example`;
  const statuses: number[] = [];
  for (let i = 0; i < 6; i++) {
    const res = await request.post("/api/auth/sign-in/email", { data: { email, password: `wrong-${i}-password` }, headers: forged(i) });
    statuses.push(res.status());
    if (res.status() === 429) expect(Number(res.headers()["retry-after"])).toBeGreaterThan(0);
  }
  expect(statuses).toEqual([401, 401, 401, 401, 401, 429]);
});

test("the session record keeps the connection's address, not the forged one", async ({ request }) => {
  const res = await request.post("/api/auth/sign-in/email", { data: { email: "crew@tallgrass.example", password: DEMO_PASSWORD }, headers: forged(77) });
  expect(res.status()).toBe(200);
  const token = ((await res.json()) as { token: string }).token;
  const ip = await withDb(async (conn) => {
    const [rows] = await conn.query("SELECT ip_address FROM session WHERE token = ?", [token]);
    return (rows as { ip_address: string | null }[])[0]?.ip_address;
  });
  expect(ip).toBe("127.0.0.1");
});

import { describe, expect, it } from "vitest";
import { clearSignInFailures, MAX_FAILURES, recordSignInFailure, signInBlocked } from "@/server/sign-in-limit";
import { uniqueEmail } from "../support/fixtures";

describe("sign-in limit (kept in MariaDB)", () => {
  it("blocks after five failures for that e-mail only, and a success clears it", async () => {
    const email = uniqueEmail("limited");
    const other = uniqueEmail("unaffected");
    for (let i = 0; i < MAX_FAILURES - 1; i++) await recordSignInFailure(email);
    expect(await signInBlocked(email)).toBe(false);
    await recordSignInFailure(email);
    expect(await signInBlocked(email)).toBe(true);
    expect(await signInBlocked(other)).toBe(false);
    await clearSignInFailures(email);
    expect(await signInBlocked(email)).toBe(false);
  });
});

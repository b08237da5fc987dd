import { describe, expect, it } from "vitest";
import { HttpError } from "@/server/errors";
import { takeVerifyTurn, VERIFY_LIMIT } from "./public-limit";

describe("takeVerifyTurn (the public /verify check's limit)", () => {
  it("allows 20 checks in 10 minutes per address, then answers 429 naming the wait", () => {
    const t0 = 1_800_000_000_000;
    const address = "203.0.113.7"; // RFC 5737 documentation address
    for (let i = 0; i < VERIFY_LIMIT.max; i++) takeVerifyTurn(address, t0 + i * 1_000);
    let refused: unknown = null;
    try {
      takeVerifyTurn(address, t0 + 60_000);
    } catch (err) {
      refused = err;
    }
    expect(refused).toBeInstanceOf(HttpError);
    expect((refused as HttpError).status).toBe(429);
    // The first check (t0) leaves the window at t0 + 10 min: 9 minutes after t0 + 1 min.
    expect((refused as HttpError).message).toBe("Too many checks from this address. Try again in 9 minutes.");

    // Another address is counted on its own; the first one may check again once its oldest check is 10 minutes old.
    expect(() => takeVerifyTurn("198.51.100.2", t0 + 60_000)).not.toThrow();
    expect(() => takeVerifyTurn(address, t0 + VERIFY_LIMIT.windowMs + 1)).not.toThrow();
    expect(() => takeVerifyTurn(address, t0 + VERIFY_LIMIT.windowMs + 2)).toThrow(HttpError);
  });
});

import { describe, expect, it } from "vitest";
import { cancelWindowClosesAt, canStillCancel, cautionsFor, formatIsoDateLong, NO_INCENTIVES_NOTE, PROPOSAL_CAUTIONS, proposalDisplayStatus, proposalLabel, proposalLinkState } from "./proposal-snapshot";
import { dateInZone } from "./zoned-time";

const future = new Date(Date.now() + 86_400_000);
const past = new Date(Date.now() - 86_400_000);

describe("link states", () => {
  it("a sent link is live until it expires; signed and cancelled records outlive the expiry", () => {
    expect(proposalLinkState({ status: "sent", expiresAt: future })).toBe("live");
    expect(proposalLinkState({ status: "sent", expiresAt: past })).toBe("expired");
    expect(proposalLinkState({ status: "signed", expiresAt: past })).toBe("signed");
    expect(proposalLinkState({ status: "cancelled", expiresAt: past })).toBe("cancelled");
    expect(proposalLinkState({ status: "revoked", expiresAt: future })).toBe("revoked");
    expect(proposalLinkState({ status: "replaced", expiresAt: future })).toBe("replaced");
  });

  it("the office sees sent, opened, then viewed", () => {
    const t0 = new Date("2026-12-01T10:00:00Z");
    expect(proposalDisplayStatus({ status: "sent", expiresAt: future, firstOpenedAt: null, lastViewedAt: null })).toBe("sent");
    expect(proposalDisplayStatus({ status: "sent", expiresAt: future, firstOpenedAt: t0, lastViewedAt: t0 })).toBe("opened");
    expect(proposalDisplayStatus({ status: "sent", expiresAt: future, firstOpenedAt: t0, lastViewedAt: new Date(t0.getTime() + 3_600_000) })).toBe("viewed");
    expect(proposalLabel(1004, 2)).toBe("P-1004 v2");
  });
});

describe("the cancellation window (16 CFR 429.1(a): prior to midnight of the deadline day)", () => {
  it("closes at midnight after the deadline day in the company's time zone, daylight saving included", () => {
    expect(cancelWindowClosesAt("2026-12-04", "America/New_York").toISOString()).toBe("2026-12-05T05:00:00.000Z");
    expect(cancelWindowClosesAt("2026-07-03", "America/Los_Angeles").toISOString()).toBe("2026-07-04T07:00:00.000Z");
    // Daylight saving starts on 2026-03-08 in the U.S.: midnight ending that day is 04:00 UTC.
    expect(cancelWindowClosesAt("2026-03-08", "America/New_York").toISOString()).toBe("2026-03-09T04:00:00.000Z");
    expect(cancelWindowClosesAt("2026-12-04", "Pacific/Honolulu").toISOString()).toBe("2026-12-05T10:00:00.000Z");
  });

  it("counts the signing day in the company's time zone", () => {
    expect(dateInZone(new Date("2026-12-05T03:00:00Z"), "America/New_York")).toBe("2026-12-04");
    expect(dateInZone(new Date("2026-12-05T06:00:00Z"), "America/New_York")).toBe("2026-12-05");
  });

  it("is open only for a signed in-home sale before the close", () => {
    const p = { status: "signed", inHomeSale: true, cancelDeadline: "2026-12-04" };
    expect(canStillCancel(p, "America/New_York", new Date("2026-12-05T04:59:59Z"))).toBe(true);
    expect(canStillCancel(p, "America/New_York", new Date("2026-12-05T05:00:00Z"))).toBe(false);
    expect(canStillCancel({ ...p, inHomeSale: false }, "America/New_York", new Date("2026-12-02T12:00:00Z"))).toBe(false);
    expect(canStillCancel({ ...p, status: "cancelled" }, "America/New_York", new Date("2026-12-02T12:00:00Z"))).toBe(false);
    expect(formatIsoDateLong("2026-12-04")).toBe("Friday, December 4, 2026");
  });
});

describe("cautions", () => {
  it("are in US English (issue #18: the homeowner's page mixed \"programme\" with US spelling)", () => {
    expect(PROPOSAL_CAUTIONS.join(" ")).not.toMatch(/programme|licence/i);
  });

  const offer = (applied: number) => ({ figures: { incentives: { applied: Array.from({ length: applied }, () => ({})) } } });
  it("says plainly when no offer has any incentive or tax credit, instead of the tax-liability line", () => {
    const none = cautionsFor([offer(0), offer(0)]);
    expect(none).toContain(NO_INCENTIVES_NOTE);
    expect(none.some((c) => c.includes("tax liability"))).toBe(false);
    const some = cautionsFor([offer(0), offer(1)]);
    expect(some).not.toContain(NO_INCENTIVES_NOTE);
    expect(some.some((c) => c.includes("tax liability"))).toBe(true);
    expect(some).toHaveLength(PROPOSAL_CAUTIONS.length);
  });
});

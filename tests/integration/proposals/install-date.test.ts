// Credits that count at installation are judged on the job's planned install date when the deal
// has a job with one, else on the offer date plus the usual lead time; the offer records which,
// and moving the job's date makes its offers stale (409 offers_stale). Real MariaDB.
import { and, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { job } from "@/db/schema";
import type { MailFake } from "@/fakes/mail-server";
import { DEFAULT_INSTALL_LEAD_DAYS } from "@/lib/offer-figures";
import { DEFAULT_TIME_ZONE } from "@/lib/schemas/company-settings";
import { addDaysToDate, todayInZone } from "@/lib/zoned-time";
import { newDeal, newWorld, rejection, startMailIfNeeded, type World } from "./support";

let fake: MailFake | null = null;
let w: World;

type Mods = {
  scope: typeof import("@/server/deal-scope");
  offers: typeof import("@/server/offers");
  proposals: typeof import("@/server/proposals");
  priceBook: typeof import("@/server/price-book");
  jobs: typeof import("@/server/jobs");
  db: typeof import("@/server/db");
};
let m: Mods;

/** A calendar date `days` after the company's today (the offer date is the company's day; new companies keep the default zone). */
const inDays = (days: number) => addDaysToDate(todayInZone(DEFAULT_TIME_ZONE), days);

beforeAll(async () => {
  fake = await startMailIfNeeded();
  m = {
    scope: await import("@/server/deal-scope"),
    offers: await import("@/server/offers"),
    proposals: await import("@/server/proposals"),
    priceBook: await import("@/server/price-book"),
    jobs: await import("@/server/jobs"),
    db: await import("@/server/db"),
  };
  w = await newWorld("Install Date Solar");
  const book = await m.priceBook.getPriceBook(w.owner.companyId);
  // A credit for systems installed by the 20th day from today: in force for a job planned on
  // day 10, over for one moved to day 30 and for the usual lead time (60 days).
  await m.priceBook.savePriceBook(w.owner, {
    ...book,
    incentives: [
      {
        id: "install-credit",
        name: "Installed-by credit",
        source: "state",
        amount: { kind: "fixed", amountCents: 200_000 },
        startDate: "2020-01-01",
        endDate: inDays(20),
        timing: "upfront",
        countsOn: "installation",
        eligibility: {},
      },
    ],
  });
}, 180_000);

afterAll(async () => {
  await fake?.close();
});

describe("the expected install date", () => {
  it("comes from the job's planned install date when there is one; moving it makes the offers stale until recomputed", async () => {
    expect(DEFAULT_INSTALL_LEAD_DAYS).toBeGreaterThan(30);
    const d = await newDeal(w);
    const offers = async () => m.offers.listOffers(await m.scope.openDeal(w.rep, d.dealId));
    const cashOf = async () => (await offers()).find((o) => o.id === d.cashOfferId)!;

    // No job yet: the offer date plus the lead time, after the credit's end.
    let cash = await cashOf();
    expect(cash.results.assumptions.installDate).toEqual({ date: inDays(DEFAULT_INSTALL_LEAD_DAYS), source: "lead_time" });
    expect(cash.results.incentives.skipped.map((s) => s.name)).toEqual(["Installed-by credit"]);

    // A job planned on day 10: the offers are stale until recomputed, then the credit applies.
    const jobId = await m.db.db().transaction((tx) => m.jobs.createJobForDeal(tx, { companyId: w.owner.companyId, dealId: d.dealId, proposalId: null }));
    const planInstall = (date: string) => m.db.db().update(job).set({ installDate: date }).where(and(eq(job.id, jobId), eq(job.companyId, w.owner.companyId)));
    await planInstall(inDays(10));
    expect((await cashOf()).stale).toEqual(["install_date"]);
    const refused = await rejection(m.proposals.sendProposal(w.rep, { dealId: d.dealId, toEmail: d.email, validDays: 30 }), 409);
    expect(refused.code).toBe("offers_stale");
    expect(refused.message).toContain("planned install date");
    cash = await m.offers.updateOffer(w.rep, d.cashOfferId, { inputs: cash.inputs });
    expect(cash.stale).toEqual([]);
    expect(cash.results.assumptions.installDate).toEqual({ date: inDays(10), source: "job" });
    expect(cash.results.incentives.applied.map((a) => a.name)).toEqual(["Installed-by credit"]);

    // Moved to day 30, after the credit's end: stale again, and recomputed without the credit.
    await planInstall(inDays(30));
    expect((await cashOf()).stale).toEqual(["install_date"]);
    cash = await m.offers.updateOffer(w.rep, d.cashOfferId, { inputs: cash.inputs });
    expect(cash.results.assumptions.installDate).toEqual({ date: inDays(30), source: "job" });
    expect(cash.results.incentives.applied).toEqual([]);
    expect(cash.results.incentives.skipped[0].reason).toBe(`ended ${inDays(20)}, before installation on ${inDays(30)}`);
  });
});

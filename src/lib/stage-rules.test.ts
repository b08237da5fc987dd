import { describe, expect, it } from "vitest";
import { boardFilterSchema, checkManualMove, DEFAULT_STALL_DAYS, isStalled, stageMoveSchema, type MoveInput } from "@/lib/stage-rules";

const move = (over: Partial<MoveInput>): MoveInput => ({ from: "lead", to: "bills_in", role: "office_manager", reason: null, permitApprovedAt: null, ...over });

describe("checkManualMove", () => {
  it("allows a plain forward move", () => {
    expect(checkManualMove(move({}))).toEqual({ ok: true });
    expect(checkManualMove(move({ from: "survey", to: "permitting" }))).toEqual({ ok: true });
  });

  it("refuses a move to the stage the deal is in", () => {
    expect(checkManualMove(move({ from: "lead", to: "lead" })).ok).toBe(false);
  });

  it("Lost needs a reason", () => {
    const refused = checkManualMove(move({ from: "proposal_out", to: "lost" }));
    expect(refused).toMatchObject({ ok: false, needs: "reason" });
    expect(checkManualMove(move({ from: "proposal_out", to: "lost", reason: "   " }))).toMatchObject({ ok: false, needs: "reason" });
    expect(checkManualMove(move({ from: "proposal_out", to: "lost", reason: "Chose another installer" }))).toEqual({ ok: true });
  });

  it("On hold needs a reason", () => {
    expect(checkManualMove(move({ from: "survey", to: "on_hold" }))).toMatchObject({ ok: false, needs: "reason" });
    expect(checkManualMove(move({ from: "survey", to: "on_hold", reason: "Roof replacement first" }))).toEqual({ ok: true });
  });

  it("Signed and Deposit paid happen by themselves", () => {
    const signed = checkManualMove(move({ from: "proposal_out", to: "signed", role: "owner", reason: "please" }));
    expect(signed).toMatchObject({ ok: false });
    expect(signed.ok ? "" : signed.reason).toMatch(/by itself.*e-signs/);
    expect("needs" in signed).toBe(false);
    const paid = checkManualMove(move({ from: "signed", to: "deposit_paid", role: "owner", reason: "paid by cheque" }));
    expect(paid.ok ? "" : paid.reason).toMatch(/by itself/);
  });

  it("Cancelled only by the customer", () => {
    const r = checkManualMove(move({ from: "signed", to: "cancelled", role: "owner", reason: "asked" }));
    expect(r.ok ? "" : r.reason).toMatch(/Only the customer can cancel/);
  });

  it("Install booked without a permit approval date: refused for the office manager, admin needs a reason", () => {
    const office = checkManualMove(move({ from: "permitting", to: "install_booked", role: "office_manager", reason: "urgent" }));
    expect(office).toMatchObject({ ok: false });
    expect(office.ok ? "" : office.reason).toMatch(/^No permit approval date is recorded for this deal/);
    expect("needs" in office && office.needs).toBeFalsy();

    const admin = checkManualMove(move({ from: "permitting", to: "install_booked", role: "admin" }));
    expect(admin).toMatchObject({ ok: false, needs: "admin_reason" });
    expect(admin.ok ? "" : admin.reason).toMatch(/No permit approval date is recorded for this deal/);

    expect(checkManualMove(move({ from: "permitting", to: "install_booked", role: "owner", reason: "Permit approved by phone" }))).toEqual({ ok: true });
  });

  it("Install booked with a permit approval date needs nothing more", () => {
    expect(checkManualMove(move({ from: "permitting", to: "install_booked", permitApprovedAt: new Date("2026-11-01") }))).toEqual({ ok: true });
  });

  it("moving back needs the office and a reason", () => {
    expect(checkManualMove(move({ from: "permitting", to: "survey" }))).toMatchObject({ ok: false, needs: "reason" });
    expect(checkManualMove(move({ from: "permitting", to: "survey", reason: "Survey photos missing" }))).toEqual({ ok: true });
    const rep = checkManualMove(move({ from: "proposal_out", to: "designing", role: "sales_rep", reason: "redo" }));
    expect(rep.ok ? "" : rep.reason).toMatch(/Only the office/);
  });

  it("refuses Proposal out by hand unless the deal has a sent proposal with an open link", () => {
    for (const role of ["sales_rep", "owner"] as const) {
      const r = checkManualMove(move({ from: "designing", to: "proposal_out", role, reason: "sent it by mail" }));
      expect(r.ok ? "" : r.reason).toMatch(/^Proposal out happens by itself when a proposal is sent/);
      expect(r.ok ? undefined : r.needs).toBeUndefined(); // no reason lets it through
    }
    expect(checkManualMove(move({ from: "on_hold", to: "proposal_out", hasLiveProposal: true }))).toEqual({ ok: true });
    expect(checkManualMove(move({ from: "designing", to: "proposal_out", role: "sales_rep", hasLiveProposal: true }))).toEqual({ ok: true });
  });

  it("a rep moves only among the early stages, On hold and Lost", () => {
    expect(checkManualMove(move({ from: "lead", to: "designing", role: "sales_rep" }))).toEqual({ ok: true });
    expect(checkManualMove(move({ from: "designing", to: "lost", role: "sales_rep", reason: "No roof space" }))).toEqual({ ok: true });
    expect(checkManualMove(move({ from: "survey", to: "permitting", role: "sales_rep" })).ok).toBe(false);
  });

  it("cannot skip past the customer's signature and deposit", () => {
    const r = checkManualMove(move({ from: "proposal_out", to: "survey", role: "owner", reason: "x" }));
    expect(r.ok ? "" : r.reason).toMatch(/signed and its deposit paid/);
  });

  it("reopening a lost deal needs a reason; leaving On hold does not", () => {
    expect(checkManualMove(move({ from: "lost", to: "designing" }))).toMatchObject({ ok: false, needs: "reason" });
    expect(checkManualMove(move({ from: "lost", to: "designing", reason: "Called back" }))).toEqual({ ok: true });
    expect(checkManualMove(move({ from: "on_hold", to: "permitting" }))).toEqual({ ok: true });
  });
});

describe("stalled flags", () => {
  it("flags only past the stage's limit", () => {
    expect(DEFAULT_STALL_DAYS.proposal_out).toBe(14);
    expect(isStalled("proposal_out", 14)).toBe(false);
    expect(isStalled("proposal_out", 15)).toBe(true);
    expect(isStalled("permitting", 21)).toBe(false);
    expect(isStalled("live", 999)).toBe(false);
    expect(isStalled("lost", 999)).toBe(false);
  });
});

describe("schemas", () => {
  it("reads a move body", () => {
    expect(stageMoveSchema.parse({ stage: "lost", reason: "  gone  " })).toEqual({ stage: "lost", reason: "gone" });
    expect(stageMoveSchema.parse({ stage: "lead", reason: "" })).toEqual({ stage: "lead", reason: null });
    expect(stageMoveSchema.safeParse({ stage: "nowhere" }).success).toBe(false);
    expect(stageMoveSchema.safeParse({ stage: "lost", reason: "x".repeat(301) }).success).toBe(false);
  });

  it("ignores bad filters", () => {
    expect(boardFilterSchema.parse({ rep: "nope", source: "Referral", from: "2026-01-01", to: "yesterday" })).toEqual({
      rep: undefined,
      source: "Referral",
      from: "2026-01-01",
      to: undefined,
    });
  });
});

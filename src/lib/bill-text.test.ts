import { describe, expect, it } from "vitest";
import { suggestBillsFromText } from "./bill-text";

describe("suggestBillsFromText (hand-made bill texts, invented utility)", () => {
  it("reads a period, kWh and the amount due", () => {
    const text = `Piedmont Electric Cooperative
      Account 0042-1187   Service address 14 Quillfeather Lane
      Billing period 01/03/2026 - 02/02/2026
      Energy used 1,024 kWh
      Amount due $142.37`;
    expect(suggestBillsFromText(text)).toEqual([
      expect.objectContaining({ periodStart: "2026-01-03", periodEnd: "2026-02-02", kwh: 1024, costCents: 14237 }),
    ]);
  });

  it("reads several periods from a usage history, each with its own figures", () => {
    const text = `Usage history
      Nov 4, 2025 to Dec 3, 2025 845 kWh total $118.20
      Dec 3, 2025 to Jan 5, 2026 1,102.5 kWh total $151.90`;
    const found = suggestBillsFromText(text);
    expect(found.map((f) => [f.periodStart, f.periodEnd, f.kwh, f.costCents])).toEqual([
      ["2025-11-04", "2025-12-03", 845, 11820],
      ["2025-12-03", "2026-01-05", 1102.5, 15190],
    ]);
  });

  it("accepts ISO dates and leaves missing figures empty rather than guessing", () => {
    expect(suggestBillsFromText("Service 2026-03-01 through 2026-03-31, see reverse")).toEqual([
      expect.objectContaining({ periodStart: "2026-03-01", periodEnd: "2026-03-31", kwh: null, costCents: null }),
    ]);
  });

  it("ignores impossible dates and reversed periods, and text without periods", () => {
    expect(suggestBillsFromText("Billing period 02/30/2026 - 03/29/2026 900 kWh")).toEqual([]);
    expect(suggestBillsFromText("Billing period 03/29/2026 - 02/27/2026 900 kWh")).toEqual([]);
    expect(suggestBillsFromText("Thank you for your payment of $120.00")).toEqual([]);
  });
});

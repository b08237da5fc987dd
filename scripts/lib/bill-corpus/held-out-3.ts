// The third held-out set, written after every change to the reader and measured without changing
// it afterwards: the honest measure of the reader as it stands (docs/read-bill.md). Kept out of
// the corpus test on purpose. Invented utilities, invented layouts.
import { across, bars, fmt, mon, monthsEnding, newDoc, seasonalKwh, table } from "./draw";
import type { CorpusBill } from "./types";

const history = (months: string[], kwh: number[]) => months.map((month, i) => ({ month, kwh: kwh[i] }));

// C1. The period in brackets after the days, "Metered consumption", a drafted amount beside the total due.
const mossgiel = (() => {
  const months = monthsEnding("2025-10", 13);
  const kwh = seasonalKwh(months, 1050, 501);
  kwh[12] = 1118;
  return {
    name: "mossgiel-drafted",
    expected: { current: { start: "2025-09-22", end: "2025-10-22", kwh: 1118, amountDueCents: 14690 }, history: history(months, kwh), source: "text" as const, warnings: [] },
    make: async () => {
      const { doc, page } = await newDoc();
      const p = page();
      p.text(40, 750, "Mossgiel County Electric", 15, true);
      p.text(40, 720, "Days of service: 30 (Sep 22, 2025 - Oct 22, 2025)", 10);
      p.text(40, 704, "Metered consumption 1,118 kWh", 10);
      p.text(40, 670, "Total Amount Due", 12, true);
      p.right(360, 670, "$146.90", 12, true);
      p.text(40, 654, "Amount to be drafted on Nov 12", 9);
      p.right(360, 654, "$146.90", 9);
      p.text(40, 610, "Usage record", 10, true);
      table(p, 594, [40, -150, -200], ["Bill Month", "Usage", "Days"], months.map((m, i) => [`${mon(m)} ${m.slice(0, 4)}`, fmt(kwh[i]), String(29 + (i % 3))]), { size: 8, step: 12 });
      return doc.save();
    },
  } satisfies CorpusBill;
})();

// C2. Figures without dollar signs, the amount in a "PLEASE REMIT" box, months across without years.
const fallowmere = (() => {
  const months = monthsEnding("2025-11", 12);
  const kwh = seasonalKwh(months, 700, 502);
  kwh[11] = 733;
  return {
    name: "fallowmere-remit",
    expected: { current: { start: "2025-10-09", end: "2025-11-07", kwh: 733, amountDueCents: 11824 }, history: history(months, kwh), source: "text" as const, warnings: [] },
    make: async () => {
      const { doc, page } = await newDoc();
      const p = page();
      p.text(40, 750, "Fallowmere Power Authority", 15, true);
      p.text(40, 720, "Bill Period: 10/09/2025-11/07/2025", 10);
      table(p, 690, [40, -200], ["Meter", "Usage (kWh)"], [["FP-8812", "733"]]);
      p.text(40, 630, "Previous Balance", 9);
      p.right(300, 630, "102.55", 9);
      p.text(40, 616, "Payments", 9);
      p.right(300, 616, "-102.55", 9);
      p.text(40, 602, "Current Charges", 9);
      p.right(300, 602, "118.24", 9);
      p.box(380, 600, 180, 50, 0.9);
      p.text(392, 636, "PLEASE REMIT", 9, true);
      p.text(392, 612, "118.24", 14, true);
      p.text(40, 540, "Twelve months", 10, true);
      across(p, 100, 524, 38, months.map(mon), [["kWh", kwh.map(fmt)]], 8);
      return doc.save();
    },
  } satisfies CorpusBill;
})();

// C3. Electric and gas with their own periods, the account's balance due, an electric-use chart.
const heronsgate = (() => {
  const months = monthsEnding("2025-11", 12);
  const kwh = seasonalKwh(months, 900, 503);
  kwh[11] = 962;
  return {
    name: "heronsgate-electric-gas",
    expected: { current: { start: "2025-10-20", end: "2025-11-18", kwh: 962, amountDueCents: 22137 }, history: history(months, kwh), source: "text" as const, warnings: [] },
    make: async () => {
      const { doc, page } = await newDoc();
      const p = page();
      p.text(40, 750, "Heronsgate Electric & Gas", 15, true);
      p.text(40, 720, "Electric Service Period 10/20/2025 - 11/18/2025", 10);
      p.text(40, 706, "Electric used 962 kWh", 10);
      p.text(40, 686, "Gas Service Period 10/21/2025 - 11/19/2025", 10);
      p.text(40, 672, "Gas used 61 therms", 10);
      p.text(40, 640, "Total Account Balance Due", 12, true);
      p.right(400, 640, "$221.37", 12, true);
      p.text(40, 590, "Electric use history", 10, true);
      bars(p, 80, 430, months.map(mon), kwh, { barW: 24, gap: 12, height: 120, ticks: [0, 500, 1000, 1500] });
      return doc.save();
    },
  } satisfies CorpusBill;
})();

// C4. Read dates as "Prior Read" / "Read Date", "Net Amount Due", a capital-credit line, "Dec 24" rows.
const copperline = (() => {
  const months = monthsEnding("2025-12", 12);
  const kwh = seasonalKwh(months, 1400, 504);
  kwh[11] = 1508;
  return {
    name: "copperline-prior-read",
    expected: { current: { start: "2025-11-03", end: "2025-12-04", kwh: 1508, amountDueCents: 19973 }, history: history(months, kwh), source: "text" as const, warnings: [] },
    make: async () => {
      const { doc, page } = await newDoc();
      const p = page();
      p.text(40, 750, "Copperline Rural Electric", 15, true);
      p.text(40, 720, "Prior Read: 11/03/2025", 10);
      p.text(200, 720, "Read Date: 12/04/2025", 10);
      p.text(360, 720, "Billing Days: 31", 10);
      p.text(40, 704, "Energy 1,508 kWh", 10);
      p.text(40, 670, "Capital Credit Retirement", 9);
      p.right(330, 670, "-$12.50", 9);
      p.text(40, 650, "Net Amount Due", 12, true);
      p.right(330, 650, "$199.73", 12, true);
      p.text(360, 640, "Monthly kWh", 10, true);
      table(p, 624, [360, -460], ["Month", "kWh"], months.map((m, i) => [`${mon(m)} ${m.slice(2, 4)}`, fmt(kwh[i])]), { size: 8, step: 12 });
      return doc.save();
    },
  } satisfies CorpusBill;
})();

export const heldOut3: CorpusBill[] = [mossgiel, fallowmere, heronsgate, copperline];

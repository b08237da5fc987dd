// The second held-out set, written after the fixes the first one showed and measured before any
// change (docs/read-bill.md); its misses were then fixed and it joined the corpus.
import { across, bars, fmt, mon, monthsEnding, newDoc, seasonalKwh, table, usd } from "./draw";
import type { CorpusBill } from "./types";

const history = (months: string[], kwh: number[]) => months.map((month, i) => ({ month, kwh: kwh[i] }));

// B1. A range with an en dash and no spaces, a "Usage" column with its unit, capital month labels.
const ashcombe = (() => {
  const months = monthsEnding("2025-12", 13);
  const kwh = seasonalKwh(months, 860, 401);
  kwh[12] = 918;
  return {
    name: "ashcombe-usage-column",
    expected: { current: { start: "2025-11-12", end: "2025-12-11", kwh: 918, amountDueCents: 13145 }, history: history(months, kwh), source: "text" as const, warnings: [] },
    make: async () => {
      const { doc, page } = await newDoc();
      const p = page();
      p.text(40, 750, "Ashcombe Valley Electric", 15, true);
      p.text(40, 722, "Billing Date Range: 11/12/2025–12/11/2025", 10);
      table(p, 694, [40, 160, -330], ["Meter Number", "Readings", "Usage"], [["AV-30127", "55,102 - 56,020", "918 kWh"]]);
      p.text(360, 722, "Total Amount Due", 11, true);
      p.right(570, 722, "$131.45", 11, true);
      p.text(360, 706, "Late Payment Amount", 9);
      p.right(570, 706, "$137.02", 9);
      p.text(40, 620, "Usage history", 10, true);
      table(p, 604, [40, -170, -220], ["Month", "kWh Used", "Days"], months.map((m, i) => [`${mon(m).toUpperCase()} ${m.slice(0, 4)}`, fmt(kwh[i]), String(29 + (i % 3))]), { size: 8, step: 12 });
      return doc.save();
    },
  } satisfies CorpusBill;
})();

// B2. "Previous:" / "Present:" read dates on one line, "Kilowatt-hours used", a chart.
const pinecrest = (() => {
  const months = monthsEnding("2025-11", 12);
  const kwh = seasonalKwh(months, 1250, 402);
  kwh[11] = 1347;
  return {
    name: "pinecrest-present-read",
    expected: { current: { start: "2025-10-03", end: "2025-11-02", kwh: 1347, amountDueCents: 17620 }, history: history(months, kwh), source: "text" as const, warnings: [] },
    make: async () => {
      const { doc, page } = await newDoc();
      const p = page();
      p.text(40, 750, "Pinecrest Rural Power District", 15, true);
      p.text(40, 720, "Meter Reading Dates    Previous: 10/03/2025    Present: 11/02/2025", 9);
      p.text(40, 704, "Kilowatt-hours used 1,347", 10);
      p.text(40, 680, "Total Charges This Period", 10);
      p.right(400, 680, "$176.20", 10);
      p.text(40, 660, "AMOUNT DUE BY NOV 24, 2025", 12, true);
      p.right(400, 660, "$176.20", 12, true);
      p.text(40, 600, "Electric use, last 12 months", 10, true);
      bars(p, 80, 440, months.map(mon), kwh, { barW: 24, gap: 12, height: 120, ticks: [0, 1000, 2000] });
      return doc.save();
    },
  } satisfies CorpusBill;
})();

// B3. Two pages: "Statement period … through …" on page 1, 13 months across with a temperature row on page 2.
const lowmoor = (() => {
  const months = monthsEnding("2025-10", 13);
  const kwh = seasonalKwh(months, 1000, 403);
  kwh[12] = 1062;
  return {
    name: "lowmoor-two-page-across",
    expected: { current: { start: "2025-09-05", end: "2025-10-06", kwh: 1062, amountDueCents: 15488 }, history: history(months, kwh), source: "text" as const, warnings: [] },
    make: async () => {
      const { doc, page } = await newDoc();
      const p = page();
      p.text(40, 750, "Lowmoor Energy Cooperative", 15, true);
      p.text(40, 720, "Statement period: September 5, 2025 through October 6, 2025", 10);
      p.text(40, 704, "Electric use 1,062 kWh", 10);
      p.text(40, 670, "Amount of your last payment $149.20 on 9/20/2025", 9);
      p.text(40, 650, "Total due", 12, true);
      p.right(330, 650, "$154.88", 12, true);
      const p2 = page();
      p2.text(40, 750, "Your use over 13 months", 11, true);
      across(p2, 100, 720, 36, months.map((m) => `${mon(m)} ${m.slice(2, 4)}`), [["kWh", kwh.map(fmt)], ["Avg. Temp", months.map((_, i) => `${35 + ((i * 11) % 45)}°`)]], 7);
      return doc.save();
    },
  } satisfies CorpusBill;
})();

// B4. Electric and water in one services table; the account's total due.
const quarryHill: CorpusBill = {
  name: "quarry-hill-services-table",
  expected: { current: { start: "2025-10-15", end: "2025-11-13", kwh: 785, amountDueCents: 14056 }, history: [], source: "text", warnings: [] },
  make: async () => {
    const { doc, page } = await newDoc();
    const p = page();
    p.text(40, 750, "Quarry Hill Light & Water", 15, true);
    table(
      p,
      710,
      [40, 110, -300, -380],
      ["Service", "Period", "Use", "Charges"],
      [
        ["Electric", "10/15/2025 - 11/13/2025", "785 kWh", usd(10244)],
        ["Water", "10/15/2025 - 11/13/2025", "4,000 gal", usd(3812)],
      ],
    );
    p.text(40, 640, "Total Amount Due", 12, true);
    p.right(380, 640, "$140.56", 12, true);
    return doc.save();
  },
};

// B5. Dates written with dashes, time-of-use "Peak Usage" / "Off-Peak Usage", "Current Balance Due", "Oct-24" rows.
const sunmeadow = (() => {
  const months = monthsEnding("2025-10", 12);
  const kwh = seasonalKwh(months, 980, 405);
  kwh[11] = 1045;
  return {
    name: "sunmeadow-dashed-dates",
    expected: { current: { start: "2025-10-01", end: "2025-10-31", kwh: 1045, amountDueCents: 12835 }, history: history(months, kwh), source: "text" as const, warnings: [] },
    make: async () => {
      const { doc, page } = await newDoc();
      const p = page();
      p.text(40, 750, "Sunmeadow Electric", 16, true);
      p.text(40, 720, "Service Period: 10-01-2025 to 10-31-2025", 10);
      p.text(40, 700, "Peak Usage 301 kWh", 10);
      p.text(40, 686, "Off-Peak Usage 744 kWh", 10);
      p.text(40, 660, "Current Balance Due", 12, true);
      p.right(330, 660, "$128.35", 12, true);
      p.text(360, 700, "Monthly history", 10, true);
      table(p, 684, [360, -460], ["Month", "kWh"], months.map((m, i) => [`${mon(m)}-${m.slice(2, 4)}`, fmt(kwh[i])]), { size: 8, step: 12 });
      return doc.save();
    },
  } satisfies CorpusBill;
})();

export const heldOut2: CorpusBill[] = [ashcombe, pinecrest, lowmoor, quarryHill, sunmeadow];

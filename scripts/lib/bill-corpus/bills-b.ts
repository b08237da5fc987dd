// Invented utilities and invented layouts, the other six bills of the corpus.
import { across, bars, fmt, mon, monthsEnding, newDoc, seasonalKwh, table, usd, yy } from "./draw";
import type { CorpusBill } from "./types";

const history = (months: string[], kwh: number[]) => months.map((month, i) => ({ month, kwh: kwh[i] }));

// 7. ISO dates, "Electricity used:", an average and last year's figure nearby, a 13-month chart with years.
const northbrook = (() => {
  const months = monthsEnding("2025-10", 13);
  const kwh = seasonalKwh(months, 1250, 77);
  kwh[12] = 1380;
  const expected = {
    current: {
      start: "2025-09-03",
      end: "2025-10-02",
      kwh: 1380,
      amountDueCents: 18840,
    },
    history: history(months, kwh),
    source: "text" as const,
    warnings: [],
  };
  return {
    name: "northbrook-iso-chart",
    expected,
    make: async () => {
      const { doc, page } = await newDoc();
      const p = page();
      p.text(40, 750, "Northbrook Hydro District", 15, true);
      p.text(40, 716, "Billing Period: 2025-09-03 to 2025-10-02", 10);
      p.text(40, 700, "Electricity used: 1,380 kWh", 10);
      p.text(40, 686, "Average daily use: 46 kWh", 9);
      p.text(40, 672, "Same month last year: 1,290 kWh", 9);
      p.text(330, 716, "Total Current Charges", 10);
      p.right(560, 716, "$188.40", 10);
      p.text(330, 700, "Amount Due", 12, true);
      p.right(560, 700, "$188.40", 12, true);
      p.text(330, 684, "Late payment charge if paid after Oct 23: $5.00", 8);
      p.text(40, 620, "Your electricity use (kWh)", 10, true);
      bars(
        p,
        70,
        450,
        months.map((m) => `${mon(m)} '${yy(m)}`),
        kwh,
        { barW: 28, gap: 8, height: 130, ticks: [0, 1000, 2000] },
      );
      return doc.save();
    },
  };
})();

// 8. A time-of-use meter table with a total row, taxes and a facilities charge; no history printed.
const fernwick: CorpusBill = {
  name: "fernwick-tou-table",
  expected: {
    current: {
      start: "2025-11-04",
      end: "2025-12-03",
      kwh: 969,
      amountDueCents: 13115,
    },
    history: [],
    source: "text",
    warnings: [],
  },
  make: async () => {
    const { doc, page } = await newDoc();
    const p = page();
    p.text(40, 750, "Fernwick Public Power", 15, true);
    p.text(40, 716, "Service dates: 11/04/2025 – 12/03/2025  (29 days)", 10);
    table(
      p,
      680,
      [40, -200, -280, -350, -420],
      ["Register", "Previous", "Current", "Multiplier", "kWh"],
      [
        ["On-peak", "10,220", "10,418", "1", "198"],
        ["Mid-peak", "22,905", "23,145", "1", "240"],
        ["Off-peak", "51,377", "51,908", "1", "531"],
        ["Total", "", "", "", "969"],
      ],
    );
    const rows: [string, string][] = [
      ["Facilities charge", "$18.00"],
      ["On-peak 198 kWh at $0.2450", "$48.51"],
      ["Mid-peak 240 kWh at $0.1400", "$33.60"],
      ["Off-peak 531 kWh at $0.0470", "$24.96"],
      ["Sales tax", "$6.08"],
    ];
    rows.forEach(([l, v], i) => (p.text(40, 580 - i * 14, l), p.right(330, 580 - i * 14, v)));
    p.text(40, 500, "Total due", 12, true);
    p.right(330, 500, "$131.15", 12, true);
    return doc.save();
  },
};

// 9. A period across the new year; month labels with no year (years from the period); "Balance due".
const harrowgate = (() => {
  const months = monthsEnding("2026-01", 12);
  const kwh = seasonalKwh(months, 1300, 99);
  kwh[11] = 1455;
  const days = months.map((_, i) => 29 + ((i * 3) % 4));
  days[11] = 34;
  const expected = {
    current: {
      start: "2025-12-02",
      end: "2026-01-05",
      kwh: 1455,
      amountDueCents: 20110,
    },
    history: history(months, kwh),
    source: "text" as const,
    warnings: [],
  };
  return {
    name: "harrowgate-new-year",
    expected,
    make: async () => {
      const { doc, page } = await newDoc();
      const p = page();
      p.text(40, 750, "Harrowgate Electric Membership Corp.", 14, true);
      p.text(40, 716, "Service period 12/02/2025 - 01/05/2026 (34 days)", 10);
      table(p, 690, [40, -170, -250, -330], ["Meter", "Start", "End", "kWh Used"], [["HG-1180", "61,040", "62,495", "1,455"]]);
      const rows: [string, string][] = [
        ["Previous balance", "$187.66"],
        ["Payment 12/10 - thank you", "-$187.66"],
        ["Customer charge", "$22.00"],
        ["Energy 1,455 kWh", "$171.92"],
        ["Sales tax", "$7.18"],
      ];
      rows.forEach(([l, v], i) => (p.text(40, 630 - i * 14, l), p.right(330, 630 - i * 14, v)));
      p.text(40, 550, "Balance due", 12, true);
      p.right(330, 550, "$201.10", 12, true);
      p.text(380, 640, "Usage history", 10, true);
      table(
        p,
        622,
        [380, -450, -490, -550],
        ["Month", "kWh", "Days", "Avg Temp"],
        months.map((m, i) => [mon(m), fmt(kwh[i]), String(days[i]), `${40 + ((i * 7) % 35)}°`]),
        { size: 8, step: 12 },
      );
      return doc.save();
    },
  };
})();

// 10. Read dates on two lines, a read-type column saying "Actual", a credit balance, MM/YYYY months across.
const marrowstone = (() => {
  const months = monthsEnding("2025-09", 12);
  const kwh = seasonalKwh(months, 480, 1010);
  kwh[11] = 512;
  const expected = {
    current: {
      start: "2025-08-30",
      end: "2025-09-29",
      kwh: 512,
      amountDueCents: 7643,
    },
    history: history(months, kwh),
    source: "text" as const,
    warnings: [],
  };
  return {
    name: "marrowstone-read-dates",
    expected,
    make: async () => {
      const { doc, page } = await newDoc();
      const p = page();
      p.text(40, 750, "Marrowstone Light Department", 15, true);
      p.text(40, 716, "Previous meter read: Aug 30, 2025", 10);
      p.text(40, 702, "Current meter read: Sep 29, 2025", 10);
      p.text(40, 688, "Days: 30", 10);
      table(p, 660, [40, 150, -330], ["Meter", "Read type", "kWh Usage"], [["M-77", "Actual", "512"]]);
      p.text(40, 610, "Balance forward", 9);
      p.right(330, 610, "$12.00 CR");
      p.text(40, 596, "Monthly service", 9);
      p.right(330, 596, "$8.25");
      p.text(40, 582, "Electric use 512 kWh", 9);
      p.right(330, 582, "$80.18");
      p.text(40, 556, "Pay this amount", 12, true);
      p.right(330, 556, "$76.43", 12, true);
      p.text(40, 500, "Last 12 months", 10, true);
      across(
        p,
        100,
        484,
        40,
        months.map((m) => `${Number(m.slice(5, 7))}/${m.slice(0, 4)}`),
        [["kWh", kwh.map(fmt)]],
        7,
      );
      return doc.save();
    },
  };
})();

// 11. Dates without a comma, "You used … kWh", a budget amount, a history table with a cost column.
const pellucid = (() => {
  const months = monthsEnding("2025-12", 13);
  const kwh = seasonalKwh(months, 690, 1111);
  kwh[12] = 734;
  const expected = {
    current: {
      start: "2025-11-03",
      end: "2025-12-02",
      kwh: 734,
      amountDueCents: 9712,
    },
    history: history(months, kwh),
    source: "text" as const,
    warnings: [],
  };
  return {
    name: "pellucid-budget",
    expected,
    make: async () => {
      const { doc, page } = await newDoc();
      const p = page();
      p.text(40, 750, "Pellucid Coast Energy", 16, true);
      p.text(40, 716, "For service Nov 3 2025 - Dec 2 2025", 10);
      p.text(40, 700, "You used 734 kWh this month.", 10);
      p.text(40, 670, "Current amount due", 11, true);
      p.right(330, 670, "$97.12", 11, true);
      p.text(40, 654, "Budget billing amount", 9);
      p.right(330, 654, "$110.00");
      p.text(40, 640, "Account balance after this bill", 9);
      p.right(330, 640, "$0.00");
      p.text(40, 600, "Your history", 10, true);
      table(
        p,
        584,
        [40, -200, -280],
        ["Billing month", "Usage (kWh)", "Cost"],
        months.map((m, i) => [`${mon(m)} ${m.slice(0, 4)}`, fmt(kwh[i]), usd(Math.round(kwh[i] * 12.1 + 1500))]),
        { size: 8, step: 12 },
      );
      return doc.save();
    },
  };
})();

// 12. Two pages: the summary on page 1; the meter table (From / To columns) and a bar chart on page 2.
const gannet = (() => {
  const months = monthsEnding("2025-12", 12);
  const kwh = seasonalKwh(months, 1700, 1212);
  kwh[11] = 1842;
  const expected = {
    current: {
      start: "2025-11-30",
      end: "2025-12-31",
      kwh: 1842,
      amountDueCents: 25604,
    },
    history: history(months, kwh),
    source: "text" as const,
    warnings: [],
  };
  return {
    name: "gannet-ridge-page-two",
    expected,
    make: async () => {
      const { doc, page } = await newDoc();
      const p = page();
      p.text(40, 750, "Gannet Ridge Utility Authority", 15, true);
      p.text(40, 720, "Statement date Jan 8, 2026", 9);
      p.text(40, 690, "Current charges", 10);
      p.right(330, 690, "$241.04", 10);
      p.text(40, 676, "Past due amount", 10);
      p.right(330, 676, "$15.00", 10);
      p.text(40, 650, "Amount due", 13, true);
      p.right(330, 650, "$256.04", 13, true);
      p.text(40, 634, "Due by Jan 29, 2026", 9);
      const p2 = page();
      p2.text(40, 750, "Meter readings", 11, true);
      table(p2, 730, [40, 120, 200, -300, -380], ["Meter", "From", "To", "Days", "kWh used"], [["G-5512", "11/30/2025", "12/31/2025", "31", "1,842"]]);
      p2.text(40, 660, "Monthly kWh", 11, true);
      bars(p2, 80, 480, months.map(mon), kwh, {
        barW: 24,
        gap: 12,
        height: 140,
        ticks: [0, 1000, 2000, 3000],
      });
      return doc.save();
    },
  };
})();

export const billsB: CorpusBill[] = [northbrook, fernwick, harrowgate, marrowstone, pellucid, gannet];

// Invented utilities and invented layouts, six of the corpus's bills. No real utility's name,
// layout or wording: each is made up to vary how bills print the same four facts.
import { across, bars, fmt, mon, monthsEnding, MONTH, newDoc, seasonalKwh, table, usd, yy } from "./draw";
import type { CorpusBill } from "./types";

const history = (months: string[], kwh: number[]) => months.map((month, i) => ({ month, kwh: kwh[i] }));

// 1. A classic layout: meter table, itemised charges, a 13-month table of month, days, kWh.
const larkhaven = (() => {
  const months = monthsEnding("2025-11", 13);
  const kwh = seasonalKwh(months, 880, 11);
  kwh[12] = 972;
  const days = months.map((_, i) => 28 + ((i * 7) % 5));
  days[12] = 28;
  const expected = {
    current: {
      start: "2025-10-28",
      end: "2025-11-25",
      kwh: 972,
      amountDueCents: 14291,
    },
    history: history(months, kwh),
    source: "text" as const,
    warnings: [],
  };
  return {
    name: "larkhaven-classic",
    expected,
    make: async () => {
      const { doc, page } = await newDoc();
      const p = page();
      p.text(40, 750, "Larkhaven Power & Light", 16, true);
      p.text(40, 734, "PO Box 4410, Larkhaven Falls", 8);
      p.text(380, 750, "Account number 7731-0942-18", 9);
      p.text(380, 738, "Statement date Nov 27, 2025", 9);
      p.text(40, 700, "Billing period: 10/28/2025 - 11/25/2025 (28 days)", 10);
      table(p, 670, [40, -200, -290, -360, -440], ["Meter", "Previous Read", "Current Read", "Multiplier", "kWh Used"], [["LP-448201", "45,210", "46,182", "1", "972"]]);
      p.text(40, 620, "Charges this period", 11, true);
      const lines: [string, string][] = [
        ["Basic charge", "$14.00"],
        ["Energy charge 972 kWh x $0.1180", "$114.70"],
        ["Fuel adjustment", "$8.75"],
        ["State tax", "$5.46"],
      ];
      lines.forEach(([l, v], i) => (p.text(40, 604 - i * 14, l), p.right(300, 604 - i * 14, v)));
      p.text(40, 540, "Previous balance", 9);
      p.right(300, 540, "$131.20");
      p.text(40, 526, "Payment received Nov 2 - thank you", 9);
      p.right(300, 526, "-$131.20");
      p.text(40, 500, "Amount due", 14, true);
      p.right(300, 500, "$142.91", 14, true);
      p.text(40, 484, "Due date Dec 16, 2025", 9);
      p.text(340, 620, "Your 13-month usage", 11, true);
      table(
        p,
        600,
        [340, -430, -480, -550],
        ["Month", "Days", "kWh", "Avg kWh/day"],
        months.map((m, i) => [`${mon(m)} ${m.slice(0, 4)}`, String(days[i]), fmt(kwh[i]), (kwh[i] / days[i]).toFixed(1)]),
        { size: 8, step: 12 },
      );
      return doc.save();
    },
  };
})();

// 2. A co-op: "Service from … through …", "Energy used", a balance paid, months across with kWh and days rows.
const cobbleCreek = (() => {
  const months = monthsEnding("2025-10", 12);
  const kwh = seasonalKwh(months, 1000, 22);
  kwh[11] = 1086;
  const days = months.map((_, i) => 29 + (i % 3));
  const expected = {
    current: {
      start: "2025-09-14",
      end: "2025-10-13",
      kwh: 1086,
      amountDueCents: 12137,
    },
    history: history(months, kwh),
    source: "text" as const,
    warnings: [],
  };
  return {
    name: "cobble-creek-across",
    expected,
    make: async () => {
      const { doc, page } = await newDoc();
      const p = page();
      p.text(40, 750, "COBBLE CREEK ELECTRIC COOPERATIVE", 14, true);
      p.text(40, 736, "Owned by the members we serve", 8);
      p.text(40, 700, "Member: Dana Whitlow     Location 22-0418", 9);
      p.text(40, 684, "Service from 09/14/25 through 10/13/25", 10, true);
      p.text(40, 664, "Energy used 1,086 kWh", 10);
      p.text(40, 650, "Cost of power  1,086 kWh @ $0.0910 per kWh", 9);
      p.right(420, 650, "$98.83");
      p.text(40, 636, "Facility charge", 9);
      p.right(420, 636, "$22.54");
      p.text(40, 610, "Previous balance", 9);
      p.right(420, 610, "$98.40");
      p.text(40, 596, "Payment received 10/01/25", 9);
      p.right(420, 596, "-$98.40");
      p.text(40, 582, "Total current charges", 9);
      p.right(420, 582, "$121.37");
      p.text(40, 560, "Total amount due", 12, true);
      p.right(420, 560, "$121.37", 12, true);
      p.text(40, 546, "Pay by 11/03/25 to avoid a late fee of $5.00", 8);
      p.text(40, 500, "Twelve months of use", 10, true);
      across(
        p,
        100,
        484,
        38,
        months.map(mon),
        [
          ["kWh", kwh.map(fmt)],
          ["Days", days.map(String)],
        ],
        8,
      );
      return doc.save();
    },
  };
})();

// 3. A municipal time-of-use bill: dd-MON-yy dates, on/off-peak lines, the amount in a box, a bar chart with no years.
const saltmarsh = (() => {
  const months = monthsEnding("2025-11", 12);
  const kwh = seasonalKwh(months, 900, 33);
  kwh[11] = 972;
  const expected = {
    current: {
      start: "2025-10-28",
      end: "2025-11-25",
      kwh: 972,
      amountDueCents: 16237,
    },
    history: history(months, kwh),
    source: "text" as const,
    warnings: [],
  };
  return {
    name: "saltmarsh-tou-chart",
    expected,
    make: async () => {
      const { doc, page } = await newDoc();
      const p = page();
      p.text(40, 752, "Saltmarsh Municipal Utilities", 15, true);
      p.text(40, 738, "Electric Department", 9);
      p.box(400, 690, 170, 60, 0.92);
      p.text(412, 734, "AMOUNT DUE", 9, true);
      p.text(412, 712, "$162.37", 16, true);
      p.text(412, 698, "by 16-DEC-25", 8);
      p.text(40, 700, "Billing Period  28-OCT-25 – 25-NOV-25", 10);
      p.text(40, 660, "Time-of-use energy", 10, true);
      const rows: [string, string][] = [
        ["Customer charge", "$12.00"],
        ["On-Peak Energy 312 kWh @ $0.2810", "$87.67"],
        ["Off-Peak Energy 660 kWh @ $0.0950", "$62.70"],
      ];
      rows.forEach(([l, v], i) => (p.text(40, 644 - i * 14, l), p.right(330, 644 - i * 14, v)));
      p.text(40, 590, "Your budget billing amount", 9);
      p.right(330, 590, "$150.00");
      p.text(40, 560, "Monthly use (kWh)", 10, true);
      bars(
        p,
        70,
        400,
        months.map((m) => mon(m).toUpperCase()),
        kwh,
        { barW: 26, gap: 12, height: 120, ticks: [0, 500, 1000, 1500] },
      );
      return doc.save();
    },
  };
})();

// 4. Two pages: the period only from the meter table's read dates; "Please pay"; the history on page 2.
const birchfield = (() => {
  const months = monthsEnding("2025-10", 12);
  const kwh = seasonalKwh(months, 700, 44);
  kwh[11] = 765;
  const expected = {
    current: {
      start: "2025-09-30",
      end: "2025-10-29",
      kwh: 765,
      amountDueCents: 8815,
    },
    history: history(months, kwh),
    source: "text" as const,
    warnings: [],
  };
  return {
    name: "birchfield-two-page",
    expected,
    make: async () => {
      const { doc, page } = await newDoc();
      const p = page();
      p.text(40, 750, "Birchfield Energy Services", 15, true);
      p.text(40, 720, "Please pay $88.15 by Nov 19, 2025", 12, true);
      p.text(40, 700, "Your budget billing amount is $95.00 a month.", 9);
      table(
        p,
        660,
        [40, 95, 185, 270, -420, -500],
        ["Meter No.", "Previous Read Date", "Current Read Date", "Previous Reading", "Current Reading", "Usage (kWh)"],
        [["B-20931", "09/30/2025", "10/29/2025", "18,442", "19,207", "765"]],
        { size: 8 },
      );
      const rows: [string, string][] = [
        ["Service charge", "$9.50"],
        ["Electricity 765 kWh", "$72.71"],
        ["City tax", "$5.94"],
        ["Current charges", "$88.15"],
      ];
      rows.forEach(([l, v], i) => (p.text(40, 600 - i * 14, l), p.right(300, 600 - i * 14, v)));
      p.text(40, 520, "See page 2 for your usage history.", 9);
      const p2 = page();
      p2.text(40, 750, "Birchfield Energy Services - page 2", 10, true);
      p2.text(40, 720, "Your usage history", 12, true);
      table(
        p2,
        700,
        [40, -220],
        ["Month", "kWh"],
        months.map((m, i) => [`${MONTH[Number(m.slice(5, 7)) - 1]} ${m.slice(0, 4)}`, fmt(kwh[i])]),
        { size: 9, step: 13 },
      );
      return doc.save();
    },
  };
})();

// 5. An estimated reading, a late-payment amount beside the amount due, history with kWh before days.
const tidewater = (() => {
  const months = monthsEnding("2025-11", 13);
  const kwh = seasonalKwh(months, 1000, 55);
  kwh[12] = 1104;
  const days = months.map((_, i) => 30 + (i % 2));
  const expected = {
    current: {
      start: "2025-10-28",
      end: "2025-11-25",
      kwh: 1104,
      amountDueCents: 14822,
    },
    history: history(months, kwh),
    source: "text" as const,
    warnings: ["estimated"],
  };
  return {
    name: "tidewater-estimated",
    expected,
    make: async () => {
      const { doc, page } = await newDoc();
      const p = page();
      p.text(40, 750, "Tidewater Rural Electric", 15, true);
      p.text(40, 714, "Service period", 9, true);
      p.text(40, 700, "Oct 28, 2025 to Nov 25, 2025", 10);
      p.text(260, 714, "Reading type: Estimated", 9);
      p.text(260, 700, "Total kWh  1,104", 10);
      p.text(40, 660, "Amount due by Dec 15, 2025", 10, true);
      p.right(400, 660, "$148.22", 12, true);
      p.text(40, 644, "Amount due after Dec 15, 2025", 9);
      p.right(400, 644, "$155.63");
      p.text(40, 628, "Member service charge", 9);
      p.right(400, 628, "$19.50");
      p.text(40, 580, "Usage over 13 months", 10, true);
      table(
        p,
        562,
        [40, -160, -220],
        ["Month", "kWh", "Days"],
        months.map((m, i) => [`${mon(m)} ${m.slice(0, 4)}`, fmt(kwh[i]), String(days[i])]),
        { size: 8, step: 12 },
      );
      return doc.save();
    },
  };
})();

// 6. Two columns side by side (account summary | usage summary), months across in two rows of six.
const quillon = (() => {
  const months = monthsEnding("2025-07", 12);
  const kwh = seasonalKwh(months, 600, 66);
  kwh[11] = 645;
  const expected = {
    current: {
      start: "2025-06-03",
      end: "2025-07-02",
      kwh: 645,
      amountDueCents: 13678,
    },
    history: history(months, kwh),
    source: "text" as const,
    warnings: [],
  };
  return {
    name: "quillon-two-columns",
    expected,
    make: async () => {
      const { doc, page } = await newDoc();
      const p = page();
      p.text(40, 750, "Quillon Valley Power", 16, true);
      const left: [string, string][] = [
        ["Previous balance", "$102.18"],
        ["Payment", "-$50.00"],
        ["Balance forward", "$52.18"],
        ["Current charges", "$84.60"],
        ["Amount due", "$136.78"],
      ];
      const right = ["Billing period Jun 3, 2025 - Jul 2, 2025", "kWh used this period 645", "Average daily use 22 kWh", "Same period last year 702 kWh", "Meter 55-2081"];
      p.text(40, 712, "Account summary", 11, true);
      p.text(330, 712, "Usage summary", 11, true);
      left.forEach(([l, v], i) => (p.text(40, 694 - i * 16, l, 10, i === 4), p.right(260, 694 - i * 16, v, 10, i === 4)));
      right.forEach((s, i) => p.text(330, 694 - i * 16, s, 10));
      p.text(40, 580, "Monthly usage", 11, true);
      across(
        p,
        110,
        560,
        52,
        months.slice(0, 6).map((m) => `${mon(m)} ${yy(m)}`),
        [["Usage (kWh)", kwh.slice(0, 6).map(fmt)]],
        9,
      );
      across(
        p,
        110,
        520,
        52,
        months.slice(6).map((m) => `${mon(m)} ${yy(m)}`),
        [["Usage (kWh)", kwh.slice(6).map(fmt)]],
        9,
      );
      return doc.save();
    },
  };
})();

export const billsA: CorpusBill[] = [larkhaven, cobbleCreek, saltmarsh, birchfield, tidewater, quillon];

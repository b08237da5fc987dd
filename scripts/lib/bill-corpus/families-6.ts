// Bills for the families held-out set 6 missed, each drawn in a layout set 6 does not use, so the
// corpus test checks the family and not set 6's page: other-language month names and bilingual
// labels, a months-across history split into rows with unlabelled figures, a newest-first table
// with lines beside it, net metering by import / export registers, and tier lines only.
// Invented utilities, invented layouts and wording.
import { fmt, monthsEnding, newDoc, seasonalKwh, table, type Pen } from "./draw";
import type { CorpusBill } from "./types";

const history = (months: string[], kwh: number[]) => months.map((month, i) => ({ month, kwh: kwh[i] }));
const ES = ["ENE", "FEB", "MAR", "ABR", "MAY", "JUN", "JUL", "AGO", "SEP", "OCT", "NOV", "DIC"];
const MONTH = ["January", "February", "March", "April", "May", "June", "July", "August", "September", "October", "November", "December"];
const SHORT = ["Jan", "Feb", "Mar", "Apr", "May", "Jun", "Jul", "Aug", "Sep", "Oct", "Nov", "Dec"];
const monthOf = (ym: string) => Number(ym.slice(5, 7)) - 1;

/** Figures right-aligned under labels centred on columns `colW` apart from x0. */
function row(p: Pen, x0: number, y: number, colW: number, cells: string[], size = 8, bold = false) {
  cells.forEach((c, i) => p.right(x0 + (i + 1) * colW, y, c, size, bold));
}

// F1 + F5. Spanish first, English second: "ENE 26" months across, a Spanish period, bilingual kWh and amount labels.
const valdemora = (() => {
  const months = monthsEnding("2026-03", 12);
  const kwh = seasonalKwh(months, 820, 701);
  kwh[11] = 1046;
  return {
    name: "valdemora-bilingual-across",
    expected: { current: { start: "2026-03-03", end: "2026-04-01", kwh: 1046, amountDueCents: 14820 }, history: history(months, kwh), source: "text" as const, warnings: [] },
    make: async () => {
      const { doc, page } = await newDoc();
      const p = page();
      p.text(40, 750, "Valdemora Luz y Fuerza", 15, true);
      p.text(40, 734, "Factura de electricidad / Electric bill", 9);
      p.text(40, 710, "Periodo: del 3 de marzo de 2026 al 1 de abril de 2026", 10);
      p.text(40, 694, "Energía consumida / Energy used", 10);
      p.right(330, 694, "1,046 kWh", 10);
      p.text(40, 672, "Saldo anterior / Previous balance", 9);
      p.right(330, 672, "$131.40", 9);
      p.text(40, 658, "Pago recibido / Payment received", 9);
      p.right(330, 658, "-$131.40", 9);
      p.text(40, 644, "Cargo fijo / Fixed charge", 9);
      p.right(330, 644, "$12.50", 9);
      p.text(40, 622, "Total a pagar / Total to pay", 12, true);
      p.right(330, 622, "$148.20", 12, true);
      p.text(40, 580, "Consumo de los últimos 12 meses / Last 12 months", 10, true);
      row(p, 100, 562, 38, months.map((m) => `${ES[monthOf(m)]} ${m.slice(2, 4)}`), 7, true);
      p.text(40, 549, "kWh", 7, true);
      row(p, 100, 549, 38, kwh.map(fmt), 7);
      return doc.save();
    },
  } satisfies CorpusBill;
})();

// F2. Thirteen months across in two rows (7 + 6): under each row of months an unlabelled row of days, then one of kWh.
const brackwater = (() => {
  const months = monthsEnding("2026-11", 13);
  const kwh = seasonalKwh(months, 900, 702);
  kwh[12] = 1120;
  const days = months.map((_, i) => [30, 31, 29, 32][i % 4]);
  return {
    name: "brackwater-split-across",
    expected: { current: { start: "2026-11-05", end: "2026-12-04", kwh: 1120, amountDueCents: 16311 }, history: history(months, kwh), source: "text" as const, warnings: [] },
    make: async () => {
      const { doc, page } = await newDoc();
      const p = page();
      p.text(40, 750, "Brackwater Valley Power", 15, true);
      p.text(40, 724, "Bill period Nov 5, 2026 - Dec 4, 2026", 10);
      p.text(40, 708, "Total kWh 1,120", 10);
      p.text(40, 684, "Please pay $163.11 by December 24, 2026", 12, true);
      p.text(40, 640, "Days and kWh, month by month", 10, true);
      const label = (m: string) => `${SHORT[monthOf(m)]} '${m.slice(2, 4)}`;
      for (const [k, [from, to]] of [
        [0, 7],
        [7, 13],
      ].entries()) {
        const y = 620 - k * 50;
        row(p, 40, y, 60, months.slice(from, to).map(label), 8, true);
        row(p, 40, y - 12, 60, days.slice(from, to).map(String), 8);
        row(p, 40, y - 24, 60, kwh.slice(from, to).map(fmt), 8);
      }
      return doc.save();
    },
  } satisfies CorpusBill;
})();

// F3. Newest first, 13 rows of full month names, kWh before days, a notice on the right whose lines fall between the rows.
const hollowfern = (() => {
  const months = monthsEnding("2026-10", 13);
  const kwh = seasonalKwh(months, 700, 703);
  kwh[12] = 688;
  const days = months.map((_, i) => [31, 30, 29, 31, 32][i % 5]);
  return {
    name: "hollowfern-newest-first",
    expected: { current: { start: "2026-09-17", end: "2026-10-16", kwh: 688, amountDueCents: 9275 }, history: history(months, kwh), source: "text" as const, warnings: [] },
    make: async () => {
      const { doc, page } = await newDoc();
      const p = page();
      p.text(40, 750, "Hollowfern Public Power District", 15, true);
      p.text(40, 724, "Service dates 09/17/2026 to 10/16/2026", 10);
      p.text(40, 708, "kWh used this period 688", 10);
      p.text(40, 684, "Amount due by 11/06/2026", 12, true);
      p.right(330, 684, "$92.75", 12, true);
      const newest = months.map((m, i) => [`${MONTH[monthOf(m)]} ${m.slice(0, 4)}`, fmt(kwh[i]), String(days[i])]).reverse();
      table(p, 640, [40, -170, -210], ["Month", "kWh", "Days"], newest, { size: 9, step: 20 });
      // Small print beside the roomy table: two or three of its lines fall between two rows.
      const notice = (
        "Planned outage notice: crews will replace the feeder on Alder Road on November 12 from 9 a.m. to 1 p.m. " +
        "Power to homes on Alder Road and Fern Court will be off for up to four hours. Keep freezers closed; food stays " +
        "cold for about four hours. If you rely on powered medical equipment, call the district at least two days ahead " +
        "so a crew can plan for it. Street lights on Alder Road will stay off until the work is finished. We are sorry " +
        "for the trouble and thank you for your patience while we make the line safer for winter storms. Questions about " +
        "this work go to the operations desk, weekdays from 7 a.m. to 5 p.m."
      ).match(/.{1,44}(\s|$)/g)!;
      notice.forEach((t, i) => p.text(300, 634 - i * 8, t.trim(), 6.5));
      return doc.save();
    },
  } satisfies CorpusBill;
})();

// F4. Net metering by registers: imported from the grid, exported to it, the net billed; history rows for each.
const saltcote = (() => {
  const months = monthsEnding("2026-08", 12);
  const imported = seasonalKwh(months, 760, 704);
  imported[11] = 812;
  const exported = months.map((_, i) => 180 + ((i * 53) % 260));
  return {
    name: "saltcote-net-imported",
    expected: { current: { start: "2026-08-01", end: "2026-08-30", kwh: 812, amountDueCents: 5564 }, history: history(months, imported), source: "text" as const, warnings: ["net-metering"] },
    make: async () => {
      const { doc, page } = await newDoc();
      const p = page();
      p.text(40, 750, "Saltcote Harbour Electric", 15, true);
      p.text(40, 724, "Billing period 2026-08-01 to 2026-08-30 · Solar customer (net metered)", 10);
      table(p, 700, [40, 130, -330], ["Meter", "Register", "kWh"], [["SH-4410", "Imported from grid", "812"], ["SH-4410", "Exported to grid", fmt(exported[11])], ["", "Net kWh billed", fmt(812 - exported[11])]], { size: 9 });
      p.text(40, 620, "Amount due", 12, true);
      p.right(330, 620, "$55.64", 12, true);
      p.text(40, 580, "Your grid energy, last 12 months", 10, true);
      row(p, 110, 562, 36, months.map((m) => SHORT[monthOf(m)]), 7, true);
      p.text(40, 549, "Imported kWh", 7, true);
      row(p, 110, 549, 36, imported.map(fmt), 7);
      p.text(40, 536, "Exported kWh", 7, true);
      row(p, 110, 536, 36, exported.map(fmt), 7);
      return doc.save();
    },
  } satisfies CorpusBill;
})();

// F6. Only tier lines say how much was used: the period's kWh is their quantities summed, never a tier's bound.
const tarnby = {
  name: "tarnby-tiers-only",
  expected: { current: { start: "2026-06-09", end: "2026-07-08", kwh: 1254, amountDueCents: 17690 }, history: [], source: "text" as const, warnings: [] },
  make: async () => {
    const { doc, page } = await newDoc();
    const p = page();
    p.text(40, 750, "Tarnby Fell Electric Co-op", 15, true);
    p.text(40, 724, "For service June 9, 2026 through July 8, 2026", 10);
    p.text(40, 700, "Energy, first 600 kWh  600 kWh @ $0.1010", 9);
    p.right(400, 700, "$60.60", 9);
    p.text(40, 686, "Energy, next 400 kWh  400 kWh @ $0.1180", 9);
    p.right(400, 686, "$47.20", 9);
    p.text(40, 672, "Energy, over 1,000 kWh  254 kWh @ $0.1420", 9);
    p.right(400, 672, "$36.07", 9);
    p.text(40, 658, "Member service charge", 9);
    p.right(400, 658, "$33.03", 9);
    p.text(40, 630, "Total amount due", 12, true);
    p.right(400, 630, "$176.90", 12, true);
    return doc.save();
  },
} satisfies CorpusBill;

export const families6: CorpusBill[] = [valdemora, brackwater, hollowfern, saltcote, tarnby];

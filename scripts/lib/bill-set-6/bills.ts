/**
 * Held-out set 6: six invented bills of invented utilities, drawn as HTML/CSS and printed to PDF by
 * chromium (scripts/make-bill-set-6.ts), plus two photos of two of them. Written by an outside
 * tester who did not read the reader: each expected JSON is what a person reads off the page.
 * Names, layouts and wording are all invented.
 *
 * What a person reads where the page offers a choice:
 * - netherby (net metering): the period's kWh and each history month are the kWh *delivered* from
 *   the grid (what the household bought), not the received or the net figure.
 * - marlowe: the amount due is the total with the unpaid previous balance, not "current charges".
 * - lindenmoor: the history months are named by the month the meter was read (its end).
 */
import type { Expected } from "../bill-set-5/bills";

export type Bill = { name: string; pages: string[]; css: string; expected: Expected };

const MON = ["Jan", "Feb", "Mar", "Apr", "May", "Jun", "Jul", "Aug", "Sep", "Oct", "Nov", "Dec"];
const MES = ["ene", "feb", "mar", "abr", "may", "jun", "jul", "ago", "sep", "oct", "nov", "dic"];

/** n months from "YYYY-MM" on. */
function months(from: string, count: number): string[] {
  const [y, m] = from.split("-").map(Number);
  return Array.from({ length: count }, (_, i) => {
    const t = y * 12 + (m - 1) + i;
    return `${Math.floor(t / 12)}-${String((t % 12) + 1).padStart(2, "0")}`;
  });
}
const mon = (ym: string) => MON[Number(ym.slice(5)) - 1];
const n = (v: number) => v.toLocaleString("en-US");
const hist = (ms: string[], kwh: number[]) => ms.map((month, i) => ({ month, kwh: kwh[i] }));
const expected = (start: string, end: string, kwh: number, cents: number, history: Expected["history"]): Expected => ({
  current: { start, end, kwh, amountDueCents: cents },
  history,
  source: "text",
  warnings: [],
});

const BASE = `@page { size: Letter; margin: 0.5in } body { margin: 0; color: #222 } table { border-collapse: collapse }
  td, th { padding: 2px 5px } .r { text-align: right } .c { text-align: center } .muted { color: #666 }`;

/** Co-op: member number, read dates, two "Energy charge" lines, a round-up; 12 rows newest first with days, avg per day, avg temp. */
function lindenmoor(): Bill {
  const ms = months("2025-12", 12);
  const kwh = [1322, 1486, 1391, 1104, 873, 802, 1055, 1318, 1402, 1190, 916, 1177];
  const days = [31, 32, 28, 30, 30, 31, 30, 31, 32, 29, 31, 30];
  const temp = [34, 29, 33, 44, 55, 65, 74, 79, 77, 69, 57, 46];
  const rows = ms
    .map((m, i) => `<tr><td>${mon(m)} ${m.slice(0, 4)}</td><td class=r>${days[i]}</td><td class=r>${n(kwh[i])}</td><td class=r>${(kwh[i] / days[i]).toFixed(1)}</td><td class=r>${temp[i]}°</td></tr>`)
    .reverse()
    .join("");
  const page = `
  <table style="width:100%"><tr><td style="font-size:17pt;font-weight:bold;color:#3d5a1e">Lindenmoor Rural Electric Cooperative</td>
    <td class=r style="font-size:9pt">Owned by the members we serve<br>Office hours 7:30–4:30 · 555-0186</td></tr></table>
  <table style="width:100%;margin-top:8px;border:1px solid #3d5a1e;font-size:9.5pt">
    <tr style="background:#e9f0df"><th>Member number</th><th>Location</th><th>Statement date</th><th>Due date</th><th>Total amount due</th></tr>
    <tr class=c><td>20417-003</td><td>Map 18-2204</td><td>11/10/2026</td><td>11/28/2026</td><td><b>$154.00</b></td></tr></table>
  <p style="font-size:9.5pt">Member: Tobias Vandermeer · 4410 County Road 9, Lindenmoor</p>
  <h4 style="margin:6px 0 2px">Meter information</h4>
  <table style="width:100%;font-size:9pt;border:1px solid #999">
    <tr style="background:#f2f2f2"><th>Meter</th><th>Previous read date</th><th>Reading</th><th>Present read date</th><th>Reading</th><th>Mult</th><th>kWh</th></tr>
    <tr class=c><td>77120448</td><td>10/08/2026</td><td>44,120</td><td>11/07/2026</td><td>45,297</td><td>1</td><td>1,177</td></tr></table>
  <div style="display:flex;gap:24px;margin-top:10px">
    <div style="flex:1"><h4 style="margin:4px 0">Account activity</h4><table style="width:100%;font-size:9.5pt">
      <tr><td>Previous balance</td><td class=r>141.22</td></tr><tr><td>Payment 11/01/2026</td><td class=r>141.22 CR</td></tr>
      <tr><td>Facility charge</td><td class=r>29.50</td></tr>
      <tr><td>Energy charge first 500 kWh @ .1050</td><td class=r>52.50</td></tr>
      <tr><td>Energy charge next 677 kWh @ .0925</td><td class=r>62.62</td></tr>
      <tr><td>Power cost adjustment 1,177 kWh @ .0042</td><td class=r>4.94</td></tr>
      <tr><td>Sales tax</td><td class=r>3.74</td></tr>
      <tr><td>Operation Round-Up contribution</td><td class=r>0.70</td></tr>
      <tr style="border-top:1px solid #000"><td><b>Total amount due</b></td><td class=r><b>154.00</b></td></tr></table>
      <p style="font-size:8pt" class=muted>Capital credits allocated to your membership for 2025: $38.16</p></div>
    <div style="flex:1.2"><h4 style="margin:4px 0">Usage history</h4><table style="width:100%;font-size:8.5pt;border:1px solid #999">
      <tr style="background:#f2f2f2"><th>Month</th><th>Days</th><th>kWh</th><th>Avg kWh per day</th><th>Avg temp</th></tr>${rows}</table></div>
  </div>`;
  return { name: "lindenmoor-coop-energy-charge", pages: [page], css: `body{font-family:"DejaVu Sans";font-size:10pt}`, expected: expected("2026-10-08", "2026-11-07", 1177, 15400, hist(ms, kwh)) };
}

/** "Billing period: 31 days from Oct 30" and read dates; unpaid balance, so current charges ≠ amount due, which is printed twice. */
function marlowe(): Bill {
  const ms = months("2025-11", 13);
  const kwh = [690, 844, 910, 788, 651, 540, 602, 877, 1012, 968, 720, 598, 812];
  const max = Math.max(...kwh);
  const bars = ms
    .map((m, i) => `<div style="display:flex;flex-direction:column;align-items:center;justify-content:flex-end;width:7.6%">
      <div style="font-size:7pt">${kwh[i]}</div><div style="width:55%;height:${Math.round((kwh[i] / max) * 90)}px;background:#b5653a"></div>
      <div style="font-size:7.5pt">${mon(m)} '${m.slice(2, 4)}</div></div>`)
    .join("");
  const page = `
  <div style="background:#b5653a;color:#fff;padding:8px 12px;font-size:16pt;font-weight:bold">MARLOWE SPRINGS POWER</div>
  <div style="display:flex;justify-content:space-between;margin-top:8px">
    <div>Account no. 5530 228 971<br>Priya Castellanos<br>902 Heather Row, Marlowe Springs</div>
    <div style="border:1px solid #b5653a;padding:8px 14px"><div>Amount due</div><div style="font-size:18pt;font-weight:bold">$151.15</div><div>Due Dec 18, 2026</div></div>
  </div>
  <p style="margin-top:10px">Billing period: 31 days from Oct 30<br>Meter read dates: Oct 30, 2026 and Nov 30, 2026 (actual reads)</p>
  <table style="width:70%;font-size:9.5pt">
    <tr><td>Balance from your last bill</td><td class=r>$109.52</td></tr>
    <tr><td>Payment received Nov 20</td><td class=r>-$54.77</td></tr>
    <tr><td>Unpaid balance</td><td class=r>$54.75</td></tr>
    <tr><td>Current charges</td><td class=r>$96.40</td></tr>
    <tr style="border-top:1px solid #000"><td><b>Amount due</b></td><td class=r><b>$151.15</b></td></tr></table>
  <h4 style="margin:10px 0 2px">Current charges</h4>
  <table style="width:70%;font-size:9.5pt">
    <tr><td>Daily service charge 31 days × $0.33</td><td class=r>$10.23</td></tr>
    <tr><td>Energy used this period: 812 kWh × $0.1013</td><td class=r>$82.26</td></tr>
    <tr><td>City franchise fee</td><td class=r>$3.91</td></tr>
    <tr style="border-top:1px solid #000"><td>Current charges</td><td class=r>$96.40</td></tr></table>
  <p style="font-size:8.5pt" class=muted>Your unpaid balance is past due. Pay $151.15 by Dec 18 to avoid a $4.82 late fee and a disconnection notice.</p>
  <h4 style="margin:8px 0 2px">kWh by month</h4>
  <div style="display:flex;align-items:flex-end;height:125px;border-bottom:1px solid #777">${bars}</div>
  <div style="margin-top:36px;border-top:1px dashed #000;padding-top:8px;display:flex;justify-content:space-between;font-size:9.5pt">
    <div>Please return this stub with your payment.<br>Marlowe Springs Power · PO Box 7731<br>Account no. 5530 228 971</div>
    <table style="border:1px solid #000"><tr><td>Due date</td><td class=r>Dec 18, 2026</td></tr><tr><td><b>Amount due</b></td><td class=r><b>$151.15</b></td></tr>
      <tr><td>Amount paid</td><td>$________</td></tr></table></div>`;
  return { name: "marlowe-days-from-stub", pages: [page], css: `body{font-family:"Liberation Sans",sans-serif;font-size:10pt}`, expected: expected("2026-10-30", "2026-11-30", 812, 15115, hist(ms, kwh)) };
}

/** Net metering: kWh delivered / received / net; the household's usage is the delivered figure. */
function netherby(): Bill {
  const ms = months("2025-12", 13);
  const del = [905, 1010, 874, 690, 612, 655, 790, 884, 861, 702, 598, 611, 642];
  const rec = [88, 102, 190, 344, 512, 640, 655, 610, 548, 431, 350, 402, 388];
  const rows = ms
    .map((m, i) => `<tr><td>${mon(m).toUpperCase()}-${m.slice(2, 4)}</td><td class=r>${n(del[i])}</td><td class=r>${n(rec[i])}</td><td class=r>${n(del[i] - rec[i])}</td></tr>`)
    .join("");
  const page = `
  <div style="display:flex;justify-content:space-between;border-bottom:3px double #204060;padding-bottom:6px">
    <div style="font-size:15pt;font-weight:bold;color:#204060">Netherby Municipal Light Department</div><div style="font-size:9pt">Town Hall Annex · 555-0133</div></div>
  <p>Account 09-33418 · Haruto &amp; Elsie Brannagh · 7 Quarry Lane, Netherby<br>Service dates 11/04/2026 to 12/03/2026 · Rate NM-1 residential net metering</p>
  <table style="width:100%;font-size:9pt;border:1px solid #204060">
    <tr style="background:#dfe7ef"><th>Meter</th><th>Channel</th><th>Previous</th><th>Present</th><th>kWh</th></tr>
    <tr><td>N-20511</td><td>kWh delivered (from grid)</td><td class=r>18,904</td><td class=r>19,546</td><td class=r>642</td></tr>
    <tr><td>N-20511</td><td>kWh received (to grid)</td><td class=r>6,120</td><td class=r>6,508</td><td class=r>388</td></tr>
    <tr><td></td><td><b>Net kWh billed</b></td><td></td><td></td><td class=r><b>254</b></td></tr></table>
  <div style="display:flex;gap:20px;margin-top:10px">
    <div style="flex:1"><table style="width:100%;font-size:9.5pt">
      <tr><td>Customer charge</td><td class=r>$18.00</td></tr>
      <tr><td>Distribution 254 kWh @ $0.0610</td><td class=r>$15.49</td></tr>
      <tr><td>Generation 254 kWh @ $0.0880</td><td class=r>$22.35</td></tr>
      <tr><td>Renewable fund</td><td class=r>$2.37</td></tr>
      <tr style="border-top:1px solid #000"><td>Total current charges</td><td class=r>$58.21</td></tr>
      <tr><td>Previous balance</td><td class=r>$61.90</td></tr><tr><td>Payments</td><td class=r>($61.90)</td></tr>
      <tr style="border-top:2px solid #000;font-size:11pt"><td><b>TOTAL DUE 12/22/2026</b></td><td class=r><b>$58.21</b></td></tr></table>
      <p style="font-size:8pt" class=muted>Banked excess generation carried forward: 0 kWh.</p></div>
    <div style="flex:1"><b>13-month history</b><table style="width:100%;font-size:8.5pt;border:1px solid #999">
      <tr style="background:#dfe7ef"><th>Month</th><th>Delivered</th><th>Received</th><th>Net</th></tr>${rows}</table></div>
  </div>`;
  return { name: "netherby-net-delivered", pages: [page], css: `body{font-family:"DejaVu Serif";font-size:10pt}`, expected: expected("2026-11-04", "2026-12-03", 642, 5821, hist(ms, del)) };
}

/** A two-column letter; the history a horizontal 13-month table split into two rows of months. */
function oakhurst(): Bill {
  const ms = months("2025-11", 13);
  const kwh = [1211, 1398, 1502, 1287, 1044, 866, 930, 1288, 1475, 1391, 1102, 941, 1036];
  const half = (from: number, to: number) =>
    `<tr style="background:#eee">${ms.slice(from, to).map((m) => `<th>${mon(m)} ${m.slice(0, 4)}</th>`).join("")}</tr>` +
    `<tr>${kwh.slice(from, to).map((v) => `<td class=c>${n(v)}</td>`).join("")}</tr>`;
  const page = `
  <div style="font-size:18pt;font-family:'DejaVu Serif';color:#5b2a6e">Oakhurst Falls Energy</div>
  <div style="font-size:9pt" class=muted>Letter of account · November 2026</div>
  <div style="columns:2;column-gap:28px;margin-top:12px;font-size:9.5pt;line-height:1.35">
    <p>Dear Marguerite Lindqvist,</p>
    <p>Thank you for being a customer of Oakhurst Falls Energy. This letter sets out your electricity account 3318-6620-4 at
    61 Tanner's Bend for the service dates Oct 15 – Nov 13, 2026 (29 days).</p>
    <p>Your meter OF-88213 read 52,418 on Oct 15 and 53,454 on Nov 13, giving a total kWh of 1,036 for the period.</p>
    <p>Last month we received your payment of $148.09 in full, thank you.</p>
    <table style="width:100%"><tr><td>Basic charge</td><td class=r>$16.00</td></tr>
      <tr><td>Energy 1,036 kWh × $0.1334</td><td class=r>$138.20</td></tr>
      <tr><td>Transmission rider</td><td class=r>$4.66</td></tr>
      <tr><td>Local tax 3.0 %</td><td class=r>$4.77</td></tr>
      <tr style="border-top:1px solid #000"><td><b>Amount due by Dec 4</b></td><td class=r><b>$163.63</b></td></tr></table>
    <p>If you would like to spread your payments evenly, our level-pay plan would bill you about $104.00 each month.</p>
    <p>With kind regards,<br>Customer Accounts, Oakhurst Falls Energy</p>
  </div>
  <h4 style="margin:14px 0 4px">Your electricity use, last 13 months (kWh)</h4>
  <table style="width:100%;font-size:8.5pt;border:1px solid #999">${half(0, 7)}</table>
  <table style="width:86%;font-size:8.5pt;border:1px solid #999;margin-top:4px">${half(7, 13)}</table>`;
  return { name: "oakhurst-letter-two-rows", pages: [page], css: `body{font-family:"Liberation Serif",serif;font-size:10pt}`, expected: expected("2026-10-15", "2026-11-13", 1036, 16363, hist(ms, kwh)) };
}

/** Day-first worded period, "$0.00" balance forward after a payment, a chart whose month labels carry no years. */
function penwyn(): Bill {
  const ms = months("2025-11", 12);
  const kwh = [612, 788, 842, 701, 566, 478, 509, 690, 802, 760, 588, 731];
  const max = Math.max(...kwh);
  const bars = ms
    .map((m, i) => `<div style="display:flex;flex-direction:column;align-items:center;justify-content:flex-end;width:8.3%">
      <div style="font-size:7.5pt">${kwh[i]}</div><div style="width:60%;height:${Math.round((kwh[i] / max) * 80)}px;background:#2f7f86"></div>
      <div style="font-size:8pt">${mon(m)}</div></div>`)
    .join("");
  const page = `
  <table style="width:100%"><tr><td><div style="font-size:16pt;font-weight:bold;color:#2f7f86">Penwyn Bay Electric</div>
    <div style="font-size:9pt">Harbour Road depot · 555-0170</div></td>
    <td class=r style="font-size:9.5pt">Customer ref. PB-7719-20<br>Issued 29 Oct 2026</td></tr></table>
  <p>Nadia Ferreira-Holt, 3 Gull Terrace, Penwyn Bay</p>
  <p style="font-size:11pt">Your electricity from 26 Sep 2026 to 27 Oct 2026</p>
  <p>You used <b>731 kWh</b> in this period (meter 4471-B, actual reading).</p>
  <table style="width:65%;font-size:9.5pt;border:1px solid #999">
    <tr><td>Previous balance</td><td class=r>$102.64</td></tr>
    <tr><td>Payment received 14 Oct 2026 – thank you</td><td class=r>−$102.64</td></tr>
    <tr><td>Balance forward</td><td class=r>$0.00</td></tr>
    <tr><td>Standing charge 31 days @ $0.42</td><td class=r>$13.02</td></tr>
    <tr><td>Electricity 731 kWh @ $0.1022</td><td class=r>$74.71</td></tr>
    <tr><td>Environmental levy</td><td class=r>$1.46</td></tr>
    <tr style="border-top:2px solid #000"><td><b>Total to pay by 17 Nov 2026</b></td><td class=r><b>$89.19</b></td></tr></table>
  <h4 style="margin:14px 0 2px">Your kWh, November 2025 to October 2026</h4>
  <div style="display:flex;align-items:flex-end;height:115px;border-bottom:1px solid #777;width:80%">${bars}</div>`;
  return { name: "penwyn-zero-forward-chart", pages: [page], css: `body{font-family:"DejaVu Sans";font-size:10pt}`, expected: expected("2026-09-26", "2026-10-27", 731, 8919, hist(ms, kwh)) };
}

/** Bilingual Spanish / English labels, Spanish month names in the history. */
function quenby(): Bill {
  const ms = months("2025-11", 13);
  const kwh = [566, 702, 745, 640, 533, 498, 611, 820, 905, 874, 702, 590, 684];
  const days = [30, 31, 32, 28, 30, 31, 29, 32, 30, 31, 30, 30, 30];
  const rows = ms.map((m, i) => `<tr><td>${MES[Number(m.slice(5)) - 1]} ${m.slice(0, 4)}</td><td class=r>${days[i]}</td><td class=r>${kwh[i]}</td></tr>`).join("");
  const page = `
  <div style="display:flex;justify-content:space-between;align-items:center">
    <div style="font-size:16pt;font-weight:bold;color:#8a3b12">Quenby Hills Power &amp; Light</div>
    <div style="font-size:9pt" class=r>Servicio al cliente / Customer service 555-0119<br>Se habla español</div></div>
  <table style="width:100%;margin-top:10px;border:1px solid #8a3b12;font-size:9.5pt">
    <tr><td>Número de cuenta / Account number</td><td class=r>604-118-2275</td></tr>
    <tr><td>Titular / Account holder</td><td class=r>Esperanza y Luis Quintana</td></tr>
    <tr><td>Periodo de servicio / Service period</td><td class=r>10/07/2026 – 11/05/2026</td></tr>
    <tr><td>Fecha de vencimiento / Due date</td><td class=r>11/26/2026</td></tr>
    <tr style="font-size:12pt;background:#f6e7dc"><td><b>Cantidad a pagar / Amount due</b></td><td class=r><b>$97.18</b></td></tr></table>
  <div style="display:flex;gap:22px;margin-top:12px">
    <div style="flex:1.3"><h4 style="margin:4px 0">Resumen / Summary</h4><table style="width:100%;font-size:9.5pt">
      <tr><td>Saldo anterior / Previous balance</td><td class=r>$88.02</td></tr>
      <tr><td>Pago recibido / Payment received</td><td class=r>-$88.02</td></tr>
      <tr><td>Cargo básico / Basic charge</td><td class=r>$11.75</td></tr>
      <tr><td>Energía / Energy 684 kWh × $0.1189</td><td class=r>$81.33</td></tr>
      <tr><td>Impuestos / Taxes</td><td class=r>$4.10</td></tr>
      <tr style="border-top:1px solid #000"><td>Cargos actuales / Current charges</td><td class=r>$97.18</td></tr></table>
      <h4 style="margin:10px 0 2px">Lectura del medidor / Meter reading</h4><table style="width:100%;font-size:9pt;border:1px solid #999">
      <tr><th>Medidor / Meter</th><th>Anterior / Previous</th><th>Actual / Present</th><th>Consumo / Usage kWh</th></tr>
      <tr class=c><td>QH-30917</td><td>27,305</td><td>27,989</td><td>684</td></tr></table></div>
    <div style="flex:1"><h4 style="margin:4px 0">Historial de consumo / Usage history</h4><table style="width:100%;font-size:8.5pt;border:1px solid #999">
      <tr><th>Mes / Month</th><th>Días / Days</th><th>kWh</th></tr>${rows}</table></div>
  </div>`;
  return { name: "quenby-bilingual", pages: [page], css: `body{font-family:"Liberation Sans",sans-serif;font-size:10pt}`, expected: expected("2026-10-07", "2026-11-05", 684, 9718, hist(ms, kwh)) };
}

export const BILLS: (() => Bill)[] = [lindenmoor, marlowe, netherby, oakhurst, penwyn, quenby];

/** Two photos: turned 1.5–3°, slightly blurred, light falling off across the page. */
export const PHOTOS = [
  { bill: "lindenmoor-coop-energy-charge", name: "lindenmoor-photo", angle: 1.8, blur: 1.0, shade: 0.4 },
  { bill: "quenby-bilingual", name: "quenby-photo", angle: -2.7, blur: 1.2, shade: 0.45 },
];

export function html(bill: Bill): string {
  const pages = bill.pages.map((p, i) => `<section style="${i ? "break-before:page" : ""}">${p}</section>`).join("");
  return `<!doctype html><html><head><meta charset="utf-8"><style>${BASE} ${bill.css}</style></head><body>${pages}</body></html>`;
}

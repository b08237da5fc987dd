/**
 * Held-out set 7, bills 5–8: a past-due bill with a late fee, a summary box and a remittance stub,
 * its history as a two-year month grid; a landscape statement in three columns with ordinal dates,
 * an estimated reading and a 13-month history with days; a final bill (deposit refunded) with a
 * sideways bar chart; a co-op demand-rate bill whose period is only its two read dates, with the
 * history (kWh beside peak kW) on page 2. All names, layouts and wording are invented.
 */
import { expected, hist, MON, months, n, type Bill } from "../bill-set-5/bills";
import { chargeRows, monthIndex, plexSans, sum, times, usd } from "./common";

/** Past due: previous balance unpaid, a late fee, current charges; the due amount in a box and on a stub. */
export function pollardine(): Bill {
  const ms = months("2025-10", 13);
  const kwh = [802, 640, 758, 812, 735, 611, 540, 602, 844, 1015, 1032, 967, 881];
  const lines = [
    { label: "Basic customer charge", cents: 1400 },
    { label: "Energy, first 500 kWh", detail: "500 kWh × $0.1052", cents: times(500, 0.1052) },
    { label: "Energy, over 500 kWh", detail: "381 kWh × $0.1188", cents: times(381, 0.1188) },
    { label: "Energy cost recovery", detail: "881 kWh × $0.0049", cents: times(881, 0.0049) },
    { label: "Storm restoration charge", cents: 259 },
  ];
  const current = sum(...lines.map((l) => l.cents));
  const [pastDue, lateFee] = [9640, 482];
  const due = pastDue + lateFee + current;
  const byYear = (year: string) =>
    MON.map((_, i) => {
      const k = ms.indexOf(`${year}-${String(i + 1).padStart(2, "0")}`);
      return `<td class=r>${k < 0 ? "—" : n(kwh[k])}</td>`;
    }).join("");
  const page = `
  <div style="display:flex;justify-content:space-between"><div><div style="font-size:19pt;font-weight:bold">Pollardine Electric Company</div>
    <div class=muted>Customer care 1-877-555-0163 · Outages 1-877-555-0164</div></div>
    <div style="border:3px solid #a01919;padding:8px 12px;min-width:200px"><div style="color:#a01919;font-weight:bold">PAST DUE — PLEASE PAY NOW</div>
      <table style="width:100%"><tr><td>Past due</td><td class=r>${usd(pastDue)}</td></tr><tr><td>Late payment charge</td><td class=r>${usd(lateFee)}</td></tr>
      <tr><td>Current charges</td><td class=r>${usd(current)}</td></tr><tr style="border-top:1px solid #000"><td><b>Amount due</b></td><td class=r><b>${usd(due)}</b></td></tr></table></div></div>
  <table style="margin-top:8px;font-size:9.5pt"><tr><td>Account number</td><td>88-1902-3375</td><td style="padding-left:30px">Bill issued</td><td>10-12-2026</td></tr>
    <tr><td>Service to</td><td>Harriet Quenneville, 77 Orchard Bend</td><td style="padding-left:30px">Billing period</td><td>09-09-2026 to 10-08-2026</td></tr></table>
  <div style="display:flex;gap:20px;margin-top:10px">
    <div style="flex:1"><h4 style="margin:2px 0">Account activity</h4><table style="width:100%">
      <tr><td>Balance from last bill (due 09-28-2026)</td><td class=r>${usd(pastDue)}</td></tr><tr><td>Payments received</td><td class=r>$0.00</td></tr>
      <tr><td>Unpaid balance</td><td class=r>${usd(pastDue)}</td></tr><tr><td>Late payment charge 5%</td><td class=r>${usd(lateFee)}</td></tr></table>
      <h4 style="margin:10px 0 2px">Meter 6604871</h4><table style="width:100%"><tr><td>Present read 10-08-2026</td><td class=r>07993</td></tr>
      <tr><td>Previous read 09-09-2026</td><td class=r>07112</td></tr><tr><td>Energy used (29 days)</td><td class=r>881 kWh</td></tr></table></div>
    <div style="flex:1.2"><h4 style="margin:2px 0">Current charges, residential service</h4><table style="width:100%">${chargeRows(lines, { label: "Current charges (due 11-02-2026)", cents: current })}</table></div>
  </div>
  <h4 style="margin:12px 0 2px">Monthly kWh</h4>
  <table style="width:100%;font-size:8.5pt;border:1px solid #999"><tr style="background:#eee"><th></th>${MON.map((m) => `<th class=r>${m}</th>`).join("")}</tr>
    <tr><td>2025</td>${byYear("2025")}</tr><tr><td>2026</td>${byYear("2026")}</tr></table>
  <p style="font-size:8.5pt" class=muted>Service may be disconnected if the past due amount is not received by 10-30-2026. Payment arrangements: 1-877-555-0163.</p>
  <div style="margin-top:26px;border-top:2px dashed #444;padding-top:10px;display:flex;justify-content:space-between">
    <div>Pollardine Electric Company<br>Return this stub with your payment<br>Account 88-1902-3375</div>
    <table style="border:1px solid #000"><tr><td>Pay immediately</td><td class=r>${usd(pastDue + lateFee)}</td></tr><tr><td>Total amount due</td><td class=r><b>${usd(due)}</b></td></tr>
      <tr><td>Amount enclosed</td><td>$ ________</td></tr></table></div>`;
  return {
    name: "pollardine-past-due-year-grid",
    pages: [page],
    css: `body{font-family:"DejaVu Sans Condensed","DejaVu Sans";font-size:9.5pt} th{font-weight:bold}`,
    expected: expected("2026-09-09", "2026-10-08", 881, due, hist(ms, kwh)),
  };
}

/** Landscape statement in three columns; ordinal dates; an estimated reading; 13 months with days. */
export function gorsewick(): Bill {
  const ms = months("2025-10", 13);
  const kwh = [1040, 1366, 1702, 1810, 1544, 1297, 980, 845, 910, 1088, 1150, 1019, 1122];
  const days = [30, 31, 32, 30, 29, 31, 30, 30, 32, 29, 31, 32, 29];
  const lines = [
    { label: "System charge", cents: 1680 },
    { label: "Energy 1,122 kWh @ 8.71¢", cents: times(1122, 0.0871) },
    { label: "Conservation rider 1,122 kWh @ 0.22¢", cents: times(1122, 0.0022) },
  ];
  const sub = sum(...lines.map((l) => l.cents));
  const tax = times(sub / 100, 0.03873);
  const total = sub + tax;
  const rows = ms.map((m, i) => `<tr><td>${MON[monthIndex(m)]} ${m.slice(0, 4)}</td><td class=r>${days[i]}</td><td class=r>${n(kwh[i])}</td><td class=r>${(kwh[i] / days[i]).toFixed(1)}</td></tr>`).join("");
  const page = `
  <div style="display:flex;align-items:baseline;gap:16px;border-bottom:4px solid #0f6b6b"><span style="font-size:20pt;font-weight:bold;color:#0f6b6b">Gorsewick Public Utility District</span>
    <span class=muted>Statement of account · Issued October 12th, 2026</span></div>
  <div style="display:grid;grid-template-columns:1fr 1.15fr 1fr;gap:18px;margin-top:10px">
    <div><div style="font-weight:bold">Customer</div>Bartholomew Achterberg<br>903 Stillwater Loop<br>Account 2011-45-880<br><br>
      <div style="background:#0f6b6b;color:#fff;padding:10px"><div>Please pay by November 2nd, 2026</div><div style="font-size:22pt;font-weight:bold">${usd(total)}</div></div>
      <p style="font-size:9pt">Last payment $104.66 received September 28th, 2026. Thank you.</p></div>
    <div><div style="font-weight:bold">This statement</div>
      <p>Service from September 9th, 2026 to October 8th, 2026 — 29 days</p>
      <table style="width:100%;font-size:9.5pt;border:1px solid #999"><tr style="background:#dcefee"><th>Meter</th><th>Prior</th><th>Present</th><th>kWh</th></tr>
        <tr><td>G-71620</td><td class=r>17,482</td><td class=r>18,604 E</td><td class=r>1,122</td></tr></table>
      <p style="font-size:8.5pt">E — estimated. We could not reach your meter this month; next month's actual reading corrects any difference.</p>
      <table style="width:100%">${chargeRows([...lines, { label: "Utility tax 3.873%", cents: tax }], { label: "Total current charges", cents: total })}</table></div>
    <div><div style="font-weight:bold">Usage history</div>
      <table style="width:100%;font-size:9pt"><tr style="background:#dcefee"><th>Month</th><th>Days</th><th>kWh</th><th>Avg/day</th></tr>${rows}</table></div>
  </div>`;
  return {
    name: "gorsewick-landscape-estimated",
    pages: [page],
    css: `@page { size: Letter landscape; margin: 0.4in } body{font-family:"DejaVu Sans";font-size:10pt} th{text-align:left}`,
    expected: expected("2026-09-09", "2026-10-08", 1122, total, hist(ms, kwh)),
  };
}

/** A final bill: service ended, deposit and its interest credited; a sideways bar chart of 12 months. */
export function ravelstoke(): Bill {
  const ms = months("2025-11", 12);
  const kwh = [655, 820, 904, 812, 700, 566, 520, 611, 760, 835, 790, 486];
  const lines = [
    { label: "Customer charge (28 of 30 days)", cents: 1120 },
    { label: "Energy", detail: "486 kWh × $0.1266", cents: times(486, 0.1266) },
    { label: "Transmission rider", detail: "486 kWh × $0.0114", cents: times(486, 0.0114) },
  ];
  const sub = sum(...lines.map((l) => l.cents));
  const tax = times(sub / 100, 0.06);
  const current = sub + tax;
  const due = current - 7500 - 148;
  const max = Math.max(...kwh);
  const chart = ms
    .map((m, i) => `<div style="display:flex;align-items:center;height:15px"><div style="width:70px;font-size:8.5pt">${MON[monthIndex(m)]} ${m.slice(0, 4)}</div>
      <div style="height:10px;width:${Math.round((kwh[i] / max) * 260)}px;background:#5a4b8a"></div><div style="font-size:8.5pt;margin-left:5px">${n(kwh[i])}</div></div>`)
    .join("");
  const page = `
  <div style="display:flex;justify-content:space-between"><div style="font-size:17pt;font-weight:bold;color:#5a4b8a">Ravelstoke Electric Light Co.</div>
    <div style="font-size:15pt;font-weight:bold;border:2px solid #5a4b8a;padding:2px 10px">FINAL BILL</div></div>
  <p>Account 40-66213-8 · Priyanka Castellanos-Reid · forwarding address 15 Harbour Row, Apt 3</p>
  <p style="background:#ecebf3;padding:6px">Your service at 212 Mill Pond Road ended 10/21/26 at your request. This bill closes the account.</p>
  <table style="font-size:10pt"><tr><td>Service dates</td><td><b>09/23/26 - 10/21/26</b></td></tr><tr><td>Meter 5512-R reads</td><td>23,904 → 24,390 (final, actual)</td></tr><tr><td>Energy used</td><td>486 kWh</td></tr></table>
  <div style="display:flex;gap:26px;margin-top:10px">
    <div style="flex:1"><h4 style="margin:2px 0">Final charges</h4><table style="width:100%">${chargeRows([...lines, { label: "Sales tax 6%", cents: tax }], { label: "Total final charges", cents: current })}</table>
      <h4 style="margin:10px 0 2px">Credits</h4><table style="width:100%"><tr><td>Deposit returned</td><td class=r>-$75.00</td></tr><tr><td>Interest on deposit</td><td class=r>-$1.48</td></tr></table>
      <div style="margin-top:10px;border:2px solid #5a4b8a;padding:8px;font-size:12pt">Please pay <b>${usd(due)}</b> by 11/12/26</div></div>
    <div style="flex:1"><h4 style="margin:2px 0">kWh by month</h4>${chart}</div>
  </div>
  <p style="font-size:8.5pt" class=muted>If the credits exceed your charges we mail a check to your forwarding address within 30 days.</p>`;
  return {
    name: "ravelstoke-final-bill-sideways-bars",
    pages: [page],
    css: `${plexSans()} body{font-family:"Plex Sans";font-size:9.5pt}`,
    expected: expected("2026-09-23", "2026-10-21", 486, due, hist(ms, kwh)),
  };
}

/** A demand rate; the period is only its two read dates; page 2 holds kWh beside peak kW by month. */
export function westerhythe(): Bill {
  const ms = months("2025-11", 12);
  const kwh = [1180, 1512, 1690, 1433, 1206, 940, 877, 1102, 1488, 1575, 1401, 1349];
  const kw = [6.9, 8.8, 9.4, 8.1, 7.2, 5.6, 5.9, 7.7, 9.9, 10.3, 9.1, 8.62];
  const days = [32, 30, 31, 31, 28, 31, 30, 31, 30, 31, 31, 30];
  const demand = times(8.62, 6.25);
  const lines = [
    { label: "Facility charge", cents: 2200 },
    { label: "Demand charge", detail: "8.62 kW × $6.25", cents: demand },
    { label: "Energy charge", detail: "1,349 kWh × $0.0688", cents: times(1349, 0.0688) },
    { label: "Power cost adjustment", detail: "1,349 kWh × $0.0031", cents: times(1349, 0.0031) },
  ];
  const current = sum(...lines.map((l) => l.cents));
  const page1 = `
  <div style="border:2px solid #204a87;padding:8px 12px;display:flex;justify-content:space-between">
    <div><div style="font-size:16pt;font-weight:bold;color:#204a87">Westerhythe Valley Electric Cooperative</div><div class=muted>Serving the valley since 1941 · 1-866-555-0188</div></div>
    <div style="text-align:right">Account 0049-2213<br>Bill date 10/19/2026</div></div>
  <p>Member: Oluwaseun &amp; Greta Lindqvist-Abara · 4407 Ridge Spur Road</p>
  <table style="width:100%;border:1px solid #777;font-size:9.5pt"><tr style="background:#dde6f3"><th>Meter</th><th>Previous read date</th><th>Present read date</th><th>Reading</th><th>Previous</th><th>Present</th><th>Mult.</th><th>Billed</th></tr>
    <tr><td>W-31177</td><td>09/14/2026</td><td>10/14/2026</td><td>kWh</td><td class=r>61,208</td><td class=r>62,557</td><td class=r>1</td><td class=r>1,349</td></tr>
    <tr><td>W-31177</td><td></td><td></td><td>kW on-peak demand</td><td></td><td class=r>8.62</td><td class=r>1</td><td class=r>8.62</td></tr></table>
  <div style="display:flex;gap:22px;margin-top:12px">
    <div style="flex:1.3"><h4 style="margin:2px 0">Residential demand rate RD-2</h4><table style="width:100%">${chargeRows(lines, { label: "Current charges", cents: current })}</table>
      <p style="font-size:8.5pt" class=muted>Your demand is the highest 15-minute average kW between 3 and 8 pm on weekdays.</p></div>
    <div style="flex:1;background:#dde6f3;padding:8px;align-self:flex-start"><table style="width:100%"><tr><td>Previous balance</td><td class=r>$158.30</td></tr>
      <tr><td>Bank draft 10/02/2026</td><td class=r>-$158.30</td></tr><tr><td>Current charges</td><td class=r>${usd(current)}</td></tr>
      <tr style="border-top:1px solid #204a87"><td><b>Total amount due</b></td><td class=r><b>${usd(current)}</b></td></tr></table>
      <p style="font-size:9pt">${usd(current)} will be drafted from your bank account on 11/02/2026. Do not mail a payment.</p></div>
  </div>
  <p style="font-size:9pt">Monthly history of energy and demand: see page 2.</p>`;
  const rows = ms.map((m, i) => `<tr><td>${m.slice(5)}/${m.slice(0, 4)}</td><td class=r>${days[i]}</td><td class=r>${n(kwh[i])}</td><td class=r>${kw[i].toFixed(2)}</td><td class=r>${((kwh[i] / (days[i] * 24 * kw[i])) * 100).toFixed(0)}%</td></tr>`).join("");
  const page2 = `<h3 style="color:#204a87;margin-top:0">Energy and demand history — account 0049-2213</h3>
    <table style="width:72%;border:1px solid #777"><tr style="background:#dde6f3"><th>Month</th><th>Days</th><th>kWh</th><th>Peak kW</th><th>Load factor</th></tr>${rows}</table>
    <p style="font-size:9pt" class=muted>Load factor compares your average use with your peak demand; a higher load factor means a steadier load.</p>`;
  return {
    name: "westerhythe-demand-read-dates-page-two",
    pages: [page1, page2],
    css: `body{font-family:"DejaVu Sans";font-size:9.5pt} th{text-align:left}`,
    expected: expected("2026-09-14", "2026-10-14", 1349, current, hist(ms, kwh)),
  };
}

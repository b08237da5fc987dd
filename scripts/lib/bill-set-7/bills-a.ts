/**
 * Held-out set 7, bills 1–4: a member co-op with ISO dates and its 13-month history on page 2, a
 * city's combined utility bill (electric, water, wastewater, refuse) with day-first dates and the
 * history across, a delivery utility's bill with a community choice supplier's generation
 * section and a bar chart labelled by initials, and a budget-billing bill whose period crosses
 * the summer/winter season change. All names, layouts and wording are invented.
 */
import { expected, hist, MON, months, n, type Bill } from "../bill-set-5/bills";
import { chargeRows, monthIndex, plexMono, plexSans, sum, times, usd } from "./common";

/** A member co-op: ISO dates, round-up donation in the amount, capital credits; history on page 2. */
export function brindlemarsh(): Bill {
  const ms = months("2025-11", 13);
  const kwh = [1210, 1485, 1642, 1390, 1088, 812, 655, 940, 1264, 1318, 1032, 761, 908];
  const days = [31, 30, 31, 32, 28, 31, 30, 31, 30, 31, 32, 29, 29];
  const temps = [44, 33, 29, 35, 46, 55, 63, 72, 79, 77, 68, 57, 45];
  const energy = times(908, 0.1042);
  const wpca = times(908, 0.00815);
  const sub = sum(2950, energy, wpca);
  const fee = times(sub / 100, 0.03);
  const beforeRound = sub + fee;
  const roundUp = 100 - (beforeRound % 100);
  const due = beforeRound + roundUp;
  const page1 = `
  <div style="display:grid;grid-template-columns:1fr 1fr;border-bottom:3px double #3c5a2a;padding-bottom:8px">
    <div><div style="font-size:17pt;font-weight:bold;color:#3c5a2a">Brindlemarsh Electric Membership Cooperative</div>
      <div style="font-style:italic">Owned by the members we serve</div><div class=muted>Member services 1-888-555-0176 · brindlemarsh-emc.example</div></div>
    <table style="justify-self:end;font-size:9pt"><tr><td>Member no.</td><td>30-4471</td></tr><tr><td>Location</td><td>41-220-07</td></tr>
      <tr><td>Statement date</td><td>2026-11-12</td></tr><tr><td>Rate</td><td>R-1 Farm &amp; Home</td></tr></table>
  </div>
  <p>Delia &amp; Amos Fairweather-Koh · 6120 County Road 14 · Brindlemarsh</p>
  <div style="display:grid;grid-template-columns:1.3fr 1fr;gap:22px">
    <div>
      <h3 style="margin:6px 0">Billing period 2026-10-08 to 2026-11-06 (29 days)</h3>
      <table style="width:100%;font-size:9.5pt;border:1px solid #999"><tr style="background:#e3ead9"><th>Meter</th><th>Reading 2026-10-08</th><th>Reading 2026-11-06</th><th>Usage</th></tr>
        <tr><td>88031245</td><td class=r>54,210</td><td class=r>55,118</td><td class=r>908 kWh</td></tr></table>
      <h4 style="margin:12px 0 4px">Charges for this period</h4>
      <table style="width:100%">${chargeRows(
        [
          { label: "Availability charge", cents: 2950 },
          { label: "Energy", detail: "908 kWh × $0.10420", cents: energy },
          { label: "Wholesale power cost adjustment", detail: "908 kWh × $0.00815", cents: wpca },
          { label: "County franchise fee", detail: "3% of charges", cents: fee },
          { label: "Operation Round Up (member gift)", cents: roundUp },
        ],
        { label: "Total this period", cents: due },
      )}</table>
    </div>
    <div>
      <div style="background:#3c5a2a;color:#fff;padding:10px 14px"><div>Amount due 2026-11-30</div><div style="font-size:24pt;font-weight:bold">${usd(due)}</div></div>
      <table style="width:100%;margin-top:10px;font-size:9.5pt"><tr><td>Balance last statement</td><td class=r>$122.80</td></tr>
        <tr><td>Payment 2026-10-25 — thank you</td><td class=r>-$122.80</td></tr><tr><td>This period</td><td class=r>${usd(due)}</td></tr></table>
      <p style="font-size:9pt;border:1px dashed #3c5a2a;padding:6px">Capital credits allocated to you for 2025: <b>$48.17</b>. Retired credits are paid by check; they are not taken off this bill.</p>
      <p style="font-size:9pt" class=muted>Your usage history is on the back of this statement.</p>
    </div>
  </div>`;
  const rows = ms.map((m, i) => `<tr><td>${m}</td><td class=r>${days[i]}</td><td class=r>${n(kwh[i])}</td><td class=r>${(kwh[i] / days[i]).toFixed(1)}</td><td class=r>${temps[i]}</td></tr>`).join("");
  const page2 = `<h3 style="color:#3c5a2a;margin-top:0">Your usage, 13 months</h3>
    <table style="width:70%;font-size:10pt;border:1px solid #999"><tr style="background:#e3ead9"><th>Month</th><th>Days</th><th>kWh</th><th>kWh per day</th><th>Avg temp °F</th></tr>${rows}</table>
    <p style="font-size:9pt" class=muted>A month is the billing period that ends in it. Member no. 30-4471.</p>`;
  return {
    name: "brindlemarsh-coop-iso-back-page",
    pages: [page1, page2],
    css: `body{font-family:"DejaVu Serif";font-size:10pt} th{font-weight:normal;text-align:left}`,
    expected: expected("2026-10-08", "2026-11-06", 908, due, hist(ms, kwh)),
  };
}

/** A city's combined bill: electric beside water, day-first dates, both usages across 13 months. */
export function orlestone(): Bill {
  const ms = months("2025-10", 13);
  const kwh = [688, 741, 905, 964, 870, 702, 596, 633, 812, 1004, 977, 846, 719];
  const gal = [5.9, 4.8, 4.6, 4.4, 4.1, 4.3, 5.0, 6.2, 7.8, 8.4, 8.1, 6.6, 5.24];
  const energy = times(719, 0.1187);
  const pca = -times(719, 0.0042);
  const electric = sum(900, energy, pca);
  const waterUse = times(5.24, 4.85);
  const total = sum(electric, 1840, waterUse, 3175, 2200, 650);
  const head = ms.map((m) => `<th>${MON[monthIndex(m)]} '${m.slice(2, 4)}</th>`).join("");
  const page = `
  <div style="text-align:center;border-bottom:2px solid #1d3f6e;padding-bottom:6px">
    <div style="font-size:16pt;font-weight:bold;color:#1d3f6e">CITY OF ORLESTONE</div><div>Department of Public Utilities · Electric · Water · Wastewater · Refuse</div>
    <div class=muted style="font-size:9pt">City Hall, 2 Tanner's Row · Utility billing office (555) 014-2290 · Open weekdays 8–4:30</div></div>
  <table style="width:100%;margin-top:8px;font-size:9.5pt"><tr><td>Account 118-20477-01</td><td>Service address 41 Weir Street</td><td>Bill date 12 Oct 2026</td></tr>
    <tr><td>Customer Ingrid Solberg-Amadi</td><td>Service period 9 Sep 2026 – 8 Oct 2026</td><td>Due date 2 Nov 2026</td></tr></table>
  <div style="display:flex;gap:18px;margin-top:10px">
    <div style="flex:1.4"><h4 style="margin:4px 0;background:#dfe7f2;padding:3px">Meters</h4>
      <table style="width:100%;font-size:9pt"><tr><th>Service</th><th>Meter</th><th>Read 9 Sep</th><th>Read 8 Oct</th><th>Used</th></tr>
        <tr><td>Electric</td><td>E-20477</td><td class=r>31,842</td><td class=r>32,561</td><td class=r>719 kWh</td></tr>
        <tr><td>Water</td><td>W-88310</td><td class=r>402.16</td><td class=r>407.40</td><td class=r>5.24 kgal</td></tr></table>
      <h4 style="margin:10px 0 4px;background:#dfe7f2;padding:3px">Electric</h4>
      <table style="width:100%">${chargeRows(
        [
          { label: "Customer charge", cents: 900 },
          { label: "Energy", detail: "719 kWh @ 11.87¢", cents: energy },
          { label: "Power cost adjustment", detail: "719 kWh @ −0.42¢", cents: pca },
        ],
        { label: "Electric total", cents: electric },
        "paren",
      )}</table>
      <h4 style="margin:10px 0 4px;background:#dfe7f2;padding:3px">Water, wastewater and refuse</h4>
      <table style="width:100%">${chargeRows(
        [
          { label: "Water base", cents: 1840 },
          { label: "Water use", detail: "5.24 kgal @ $4.85", cents: waterUse },
          { label: "Wastewater flat", cents: 3175 },
          { label: "Refuse cart 64 gal", cents: 2200 },
          { label: "Stormwater", cents: 650 },
        ],
        { label: "Water, wastewater, refuse total", cents: sum(1840, waterUse, 3175, 2200, 650) },
      )}</table></div>
    <div style="flex:1;border:1px solid #1d3f6e;padding:8px;align-self:flex-start">
      <div style="font-weight:bold">Account summary</div><table style="width:100%;font-size:9.5pt">
      <tr><td>Previous bill</td><td class=r>$188.02</td></tr><tr><td>Paid 21 Sep 2026</td><td class=r>($188.02)</td></tr>
      <tr><td>Electric</td><td class=r>${usd(electric)}</td></tr><tr><td>Water/wastewater/refuse</td><td class=r>${usd(total - electric)}</td></tr>
      <tr style="border-top:2px solid #1d3f6e"><td><b>Total due by 2 Nov 2026</b></td><td class=r><b>${usd(total)}</b></td></tr></table>
      <p style="font-size:8.5pt" class=muted>Unpaid balances after the due date carry a 1.5% penalty.</p></div>
  </div>
  <h4 style="margin:12px 0 4px;background:#dfe7f2;padding:3px">Use over the last 13 billing periods</h4>
  <table style="width:100%;font-size:8pt;text-align:right"><tr><th></th>${head}</tr>
    <tr><td style="text-align:left">Electric kWh</td>${kwh.map((v) => `<td>${n(v)}</td>`).join("")}</tr>
    <tr><td style="text-align:left">Water kgal</td>${gal.map((v) => `<td>${v.toFixed(1)}</td>`).join("")}</tr></table>`;
  return {
    name: "orlestone-city-combined-across",
    pages: [page],
    css: `body{font-family:"DejaVu Sans";font-size:9.5pt} th{font-weight:bold;font-size:8.5pt;text-align:right}`,
    expected: expected("2026-09-09", "2026-10-08", 719, total, hist(ms, kwh)),
  };
}

/** Delivery by the wires utility, generation by a community choice supplier; chart labelled by initials. */
export function tallowind(): Bill {
  const ms = months("2025-12", 12);
  const kwh = [1118, 1206, 1034, 872, 690, 744, 931, 1187, 1240, 1105, 902, 1043];
  const [peak, off] = [212, 831];
  const del = [1200, times(peak, 0.093), times(off, 0.0612), times(1043, 0.0061), times(1043, 0.0214)];
  const gen = [times(peak, 0.1345), times(off, 0.0788)];
  const [delivery, generation] = [sum(...del), sum(...gen)];
  const tax = times((delivery + generation) / 100, 0.045);
  const total = delivery + generation + tax;
  const max = Math.max(...kwh);
  const bars = kwh
    .map((v, i) => `<div style="flex:1;display:flex;flex-direction:column;align-items:center;justify-content:flex-end">
      <div style="font-size:7pt">${n(v)}</div><div style="width:55%;height:${Math.round((v / max) * 110)}px;background:${i === kwh.length - 1 ? "#c2571a" : "#e6b38f"}"></div>
      <div style="font-size:8pt">${MON[monthIndex(ms[i])][0]}</div></div>`)
    .join("");
  const page1 = `
  <div style="display:flex;justify-content:space-between;align-items:center"><div style="font-size:18pt;font-weight:bold;color:#7a2e0e">Ebbridge Electric Delivery</div>
    <div style="text-align:right;font-size:9pt">Account 7702 118 406<br>Statement Nov. 7, 2026</div></div>
  <div style="background:#fbeee4;padding:10px;margin-top:8px;display:grid;grid-template-columns:1fr 1fr;gap:10px">
    <div>Nikolai Brennan-Oduya<br>2209 Lantern Hill Dr<br><br>Service: <b>Oct. 6 – Nov. 4, 2026</b> · 29 days</div>
    <div style="text-align:right"><div>Amount due by Nov. 27, 2026</div><div style="font-size:26pt;font-weight:bold">${usd(total)}</div></div></div>
  <table style="width:60%;margin-top:10px"><tr><td>Last bill</td><td class=r>$197.12</td></tr><tr><td>Payment Oct. 19 · thank you</td><td class=r>-$197.12</td></tr>
    <tr><td>Ebbridge delivery charges</td><td class=r>${usd(delivery)}</td></tr><tr><td>Tallowind Community Power generation charges</td><td class=r>${usd(generation)}</td></tr>
    <tr><td>Taxes</td><td class=r>${usd(tax)}</td></tr><tr style="border-top:1px solid #000"><td><b>Total amount due</b></td><td class=r><b>${usd(total)}</b></td></tr></table>
  <h4 style="margin:16px 0 2px">Your electricity use, kWh</h4>
  <div style="display:flex;height:150px;border-bottom:1px solid #777;width:75%">${bars}</div>
  <div style="display:flex;width:75%;font-size:7.5pt" class=muted><div style="flex:1">2025</div><div style="flex:11">2026</div></div>
  <p style="font-size:8.5pt" class=muted>Details of delivery and generation charges are on page 2.</p>`;
  const page2 = `
  <h3 style="color:#7a2e0e;margin-top:0">Ebbridge Electric Delivery — delivery charges</h3>
  <table style="width:85%;font-size:9.5pt;border:1px solid #bbb"><tr style="background:#fbeee4"><th>Meter</th><th>Period</th><th>Peak 4–9 pm</th><th>Off-peak</th><th>Total usage</th></tr>
    <tr><td>1ED-55043</td><td>Oct. 6 – Nov. 4</td><td class=r>${peak} kWh</td><td class=r>${off} kWh</td><td class=r>1,043 kWh</td></tr></table>
  <table style="width:85%;margin-top:6px">${chargeRows(
    [
      { label: "Basic service", cents: del[0] },
      { label: "Delivery, peak", detail: `${peak} kWh × $0.09300`, cents: del[1] },
      { label: "Delivery, off-peak", detail: `${off} kWh × $0.06120`, cents: del[2] },
      { label: "Public purpose programs", detail: "1,043 kWh × $0.00610", cents: del[3] },
      { label: "Power charge indifference adjustment", detail: "1,043 kWh × $0.02140", cents: del[4] },
    ],
    { label: "Total delivery charges", cents: delivery },
  )}</table>
  <h3 style="color:#1f5d4c;margin-top:18px">Tallowind Community Power — generation charges</h3>
  <p style="font-size:9pt">Tallowind buys the power you use; Ebbridge delivers it and collects for Tallowind on this bill. Questions about generation: (555) 010-7733.</p>
  <table style="width:85%">${chargeRows(
    [
      { label: "Generation, peak", detail: `${peak} kWh × $0.13450`, cents: gen[0] },
      { label: "Generation, off-peak", detail: `${off} kWh × $0.07880`, cents: gen[1] },
    ],
    { label: "Total Tallowind charges", cents: generation },
  )}</table>
  <p style="font-size:9pt">Had Ebbridge bought your power this period, generation would have cost about $101.40.</p>
  <h4>Taxes</h4><table style="width:85%">${chargeRows([{ label: "City utility users' tax", detail: "4.5%", cents: tax }], { label: "Total taxes", cents: tax })}</table>`;
  return {
    name: "tallowind-choice-supplier-initials-chart",
    pages: [page1, page2],
    css: `${plexSans()} body{font-family:"Plex Sans";font-size:9.5pt} th{text-align:left;font-weight:600}`,
    expected: expected("2026-10-06", "2026-11-04", 1043, total, hist(ms, kwh)),
  };
}

/** Budget billing across the season change; the period's dates carry no year; history with dollars. */
export function heddlestone(): Bill {
  const ms = months("2025-11", 12);
  const kwh = [702, 866, 951, 880, 744, 618, 560, 721, 1012, 1096, 941, 767];
  const billed = [9412, 11105, 12188, 11342, 9720, 8233, 7654, 9660, 14420, 15702, 13388, 0];
  const tou = [
    ["Summer on-peak (Sep 24–30)", 38, 0.2212],
    ["Summer off-peak (Sep 24–30)", 141, 0.0984],
    ["Winter on-peak (Oct 1–23)", 102, 0.1621],
    ["Winter off-peak (Oct 1–23)", 486, 0.0903],
  ] as const;
  const touCents = tou.map(([, k, r]) => times(k, r));
  const fuel = times(767, 0.0196);
  const sub = sum(1125, ...touCents, fuel);
  const tax = times(sub / 100, 0.015);
  const actual = sub + tax;
  billed[11] = actual;
  const budget = 11800;
  const budgetBalance = -5361 + (actual - budget);
  const rows = ms.map((m, i) => `<tr><td>${MON[monthIndex(m)].toUpperCase()} ${m.slice(0, 4)}</td><td class=r>${n(kwh[i])}</td><td class=r>${usd(billed[i])}</td></tr>`).join("");
  const page = `
  <div style="font-family:'Plex Mono';font-size:15pt;font-weight:bold;letter-spacing:2px">HEDDLESTONE POWER &amp; LIGHT</div>
  <div class=muted>PO Box 4410 · Heddlestone · 1-800-555-0119</div>
  <div style="display:flex;gap:16px;margin-top:10px">
    <div style="flex:1.5">
      <table style="width:100%"><tr><td>ACCOUNT</td><td>5530-118-270</td></tr><tr><td>NAME</td><td>TOMASZ &amp; RENATA OYELARAN</td></tr>
        <tr><td>BILL DATE</td><td>NOVEMBER 2, 2026</td></tr><tr><td>SERVICE</td><td>SEP 24 – OCT 23 (29 DAYS)</td></tr><tr><td>RATE</td><td>RTS SEASONAL TIME-OF-DAY</td></tr></table>
      <div style="margin-top:10px">METER 7H-44012 &nbsp; READ SEP 24: 30,118 &nbsp; READ OCT 23: 30,885 &nbsp; KWH USED 767</div>
      <div style="margin-top:10px;font-weight:bold">ACTUAL CHARGES FOR THIS PERIOD</div>
      <table style="width:100%">${chargeRows(
        [
          { label: "Basic charge", cents: 1125 },
          ...tou.map(([label, k, r], i) => ({ label, detail: `${k} kWh @ ${r.toFixed(4)}`, cents: touCents[i] })),
          { label: "Fuel recovery", detail: "767 kWh @ 0.0196", cents: fuel },
          { label: "State sales tax 1.5%", cents: tax },
        ],
        { label: "Actual charges", cents: actual },
      )}</table>
    </div>
    <div style="flex:1;border:2px solid #000;padding:8px;align-self:flex-start">
      <div style="font-weight:bold">BUDGET BILLING</div>
      <table style="width:100%"><tr><td>Previous balance</td><td class=r>$118.00</td></tr><tr><td>Payment 10/20 - thank you</td><td class=r>-$118.00</td></tr>
        <tr><td>Actual charges</td><td class=r>${usd(actual)}</td></tr><tr><td>Budget balance to date</td><td class=r>${usd(budgetBalance, "cr")}</td></tr></table>
      <div style="margin-top:8px;border-top:1px solid #000;padding-top:6px">YOUR BUDGET AMOUNT DUE<br>BY NOV 22, 2026</div><div style="font-size:20pt;font-weight:bold">${usd(budget)}</div>
      <p style="font-size:8pt">Budget billing spreads your cost evenly. Your budget balance is settled in your anniversary month (April).</p>
    </div>
  </div>
  <div style="margin-top:12px;font-weight:bold">12-MONTH HISTORY</div>
  <table style="width:55%;font-size:9pt"><tr><th>MONTH</th><th>KWH</th><th>ACTUAL COST</th></tr>${rows}</table>`;
  return {
    name: "heddlestone-budget-season-change",
    pages: [page],
    css: `${plexMono()} body{font-family:"Plex Mono";font-size:8.5pt} th{text-align:left}`,
    expected: expected("2026-09-24", "2026-10-23", 767, budget, hist(ms, kwh)),
  };
}

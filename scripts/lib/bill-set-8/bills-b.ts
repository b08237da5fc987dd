/**
 * Held-out set 8, bills 4–6: an investor-owned utility's net-metering bill (delivered, received
 * and net kWh; its history prints all three), a public power district on budget billing (the
 * amount due is the budget amount, not the month's actual charges; only a three-month comparison),
 * and a past-due bill with two meters whose kWh add up, a disconnection minimum and a late fee.
 */
import { MON, amt, expected, fixed, kwh, lineRows, monthsEnding, pct, rated, sum, usd, type Bill } from "./common";

export function oxhollow(): Bill {
  const delivered = 32_586 - 31_774;
  const received = 10_344 - 9_908;
  const net = delivered - received;
  const lines = [fixed("Basic Service Charge", 1250), rated("Energy Charge (net kWh)", net, 0.1326), rated("Purchased Power Adjustment", net, 0.02104), rated("Grid Access Charge", 7.2, 0.93, "kW-dc", 2)];
  const taxes = [pct("State Sales Tax", sum(lines), 5.6), pct("City Tax", sum(lines), 2)];
  const current = sum(lines) + sum(taxes);
  const flows: [number, number][] = [[702, 298], [845, 211], [910, 236], [788, 327], [655, 452], [548, 484], [712, 561], [1034, 598], [1266, 571], [1198, 540], [961, 489], [delivered, received]];
  const hist = monthsEnding(2026, 10, flows.map(([d, r]) => d - r));
  const rows = hist.map((h, i) => `<tr><td>${String(h.m).padStart(2, "0")}/${h.y}</td><td>${kwh(flows[i][0])}</td><td>${kwh(flows[i][1])}</td><td><b>${kwh(h.kwh)}</b></td></tr>`).join("");
  const page = `
    <div class="mast"><span class="ox">OXHOLLOW</span> <span>Electric Service Company</span><div class="r">Customer Care 1-800-555-0126 &middot; oxhollowelectric.example</div></div>
    <div class="grid">
      <div class="card"><div class="k">Account</div><div>3318-20447-9</div><div class="k">Statement date</div><div>Oct 31, 2026</div>
        <div class="k">Service address</div><div>2290 E SAGUARO BEND<br>MESA VERDE HEIGHTS</div><div class="k">Rate</div><div>R-NM Residential Net Metering</div></div>
      <div class="card amount"><div class="k">Amount due</div><div class="big">${usd(current)}</div><div>Please pay by Nov 18, 2026</div>
        <table><tr><td>Previous balance</td><td>${usd(6109)}</td></tr><tr><td>Payment received Oct 14</td><td>-${usd(6109)}</td></tr><tr><td>Current charges</td><td>${usd(current)}</td></tr></table></div>
    </div>
    <h3>Meter reading &middot; Service period 09/30/26 - 10/29/26 (29 days)</h3>
    <table class="m"><tr><th>Meter NM-550182</th><th>Previous</th><th>Current</th><th>kWh</th></tr>
      <tr><td>Delivered to you (channel 1)</td><td>31,774</td><td>32,586</td><td>${kwh(delivered)}</td></tr>
      <tr><td>Received from you (channel 2)</td><td>9,908</td><td>10,344</td><td>${kwh(received)}</td></tr>
      <tr class="t"><td colspan="3">Net kWh billed</td><td>${kwh(net)}</td></tr></table>
    <p class="small">Solar system on file: 7.2 kW-dc. Excess energy banked this period: 0 kWh. Banked kWh carried forward: 0.</p>
    <h3>Charges</h3>
    <table class="c">${lineRows([...lines, ...taxes])}<tr class="t"><td>Current charges</td><td></td><td class="n">${amt(current)}</td></tr></table>
    <h3>Your energy over 12 months</h3>
    <table class="m"><tr><th>Month</th><th>Delivered kWh</th><th>Received kWh</th><th>Net kWh</th></tr>${rows}</table>`;
  return {
    name: "oxhollow-net-metering",
    css: `body { font-family: "DejaVu Sans", sans-serif; font-size: 10px; color: #2b2b2b; } .mast { background: #8a3b12; color: #fff; padding: 8px 12px; font-size: 13px; }
      .ox { font-size: 22px; font-weight: bold; letter-spacing: 1px; } .r { font-size: 9px; margin-top: 2px; } .grid { display: grid; grid-template-columns: 1fr 1fr; gap: 12px; margin: 10px 0; }
      .card { border: 1px solid #c9a38c; padding: 8px; } .k { font-size: 8.5px; text-transform: uppercase; color: #8a3b12; margin-top: 4px; } .amount { background: #fbf1ea; }
      .big { font-size: 26px; font-weight: bold; } .amount table { width: 100%; margin-top: 6px; } .amount td:last-child { text-align: right; }
      h3 { font-size: 11.5px; color: #8a3b12; margin: 10px 0 4px; } table { border-collapse: collapse; } .m { width: 100%; } .m th { background: #f3e2d6; text-align: left; padding: 3px; }
      .m td { padding: 2px 4px; border-bottom: 1px solid #eee; } .m td:not(:first-child), .m th:not(:first-child) { text-align: right; } .t td { font-weight: bold; border-top: 1px solid #555; }
      .c { width: 80%; } .c td { padding: 2px 4px; } .n { text-align: right; } .d { color: #666; } .small { font-size: 9px; }`,
    pages: [page],
    expected: expected({ start: "2026-09-30", end: "2026-10-29", kwh: net, amountDueCents: current }, hist),
  };
}

export function ferncastle(): Bill {
  const used = 71_260 - 70_118;
  const lines = [fixed("Customer Charge", 2800), rated("Winter Energy", used, 0.0842, "kWh", 4), rated("Production Cost Adjustment", used, 0.0031, "kWh", 4)];
  const taxes = [pct("City Lieu Tax", sum(lines), 5), pct("State Sales Tax", sum(lines), 5.5)];
  const actual = sum(lines) + sum(taxes);
  const budget = 11800;
  const priorDeferred = 6140;
  const compare = [
    { label: "Oct 2025", note: "Last year", key: "2025-10", days: 29, kwh: 1010, temp: 58 },
    { label: "Sep 2026", note: "Last month", key: "2026-09", days: 31, kwh: 1296, temp: 70 },
    { label: "Oct 2026", note: "This month", key: "2026-10", days: 30, kwh: used, temp: 56 },
  ];
  const col = (f: (c: (typeof compare)[number]) => string) => compare.map((c) => `<td>${f(c)}</td>`).join("");
  const page = `
    <div class="top"><div class="name">FERNCASTLE<br>PUBLIC POWER DISTRICT</div><div class="info">Customer Service 402-555-0117<br>Pay by phone 402-555-0133</div></div>
    <table class="acct"><tr><th>ACCOUNT NUMBER</th><th>CYCLE</th><th>BILLING DATE</th><th>DUE DATE</th><th>AMOUNT DUE</th></tr>
      <tr><td>61-0094-3</td><td>14</td><td>OCT 30 2026</td><td>NOV 17 2026</td><td>${usd(budget)}</td></tr></table>
    <p>SERVICE LOCATION: 7 PRAIRIE VIEW DR, ODELL FLATS &nbsp;&nbsp; CUSTOMER: HALVORSEN, INGRID</p>
    <table class="read"><tr><th>METER</th><th>FROM</th><th>TO</th><th>DAYS</th><th>PREVIOUS</th><th>PRESENT</th><th>KWH</th></tr>
      <tr><td>88304</td><td>28-SEP-26</td><td>28-OCT-26</td><td>30</td><td>70,118</td><td>71,260</td><td>${kwh(used)}</td></tr></table>
    <div class="two"><div><h4>CHARGES FOR THIS PERIOD (RATE 10 RESIDENTIAL)</h4>
      <table class="ch">${lineRows([...lines, ...taxes])}<tr class="t"><td>ACTUAL CHARGES THIS PERIOD</td><td></td><td class="n">${amt(actual)}</td></tr></table></div>
      <div><h4>BUDGET BILLING PLAN</h4><table class="ch">
        <tr><td>Actual charges this period</td><td class="n">${amt(actual)}</td></tr><tr><td>Budget amount billed</td><td class="n">${amt(budget)}</td></tr>
        <tr><td>Difference added to deferred balance</td><td class="n">${amt(actual - budget)}</td></tr><tr><td>Deferred balance last bill</td><td class="n">${amt(priorDeferred)}</td></tr>
        <tr class="t"><td>Deferred balance to date</td><td class="n">${amt(priorDeferred + actual - budget)}</td></tr></table>
        <p class="small">Your budget amount is reviewed each April and settled at the anniversary of your plan.</p></div></div>
    <h4>ACCOUNT SUMMARY</h4>
    <table class="ch sum"><tr><td>Previous balance</td><td class="n">${amt(budget)}</td></tr><tr><td>Payment 10/15/26</td><td class="n">${amt(-budget)}</td></tr>
      <tr><td>Budget billing amount</td><td class="n">${amt(budget)}</td></tr><tr class="t"><td>AMOUNT DUE BY NOV 17 2026</td><td class="n">${usd(budget)}</td></tr></table>
    <h4>USAGE COMPARISON</h4>
    <table class="cmp"><tr><th></th>${compare.map((c) => `<th>${c.label}<br><small>${c.note}</small></th>`).join("")}</tr>
      <tr><th>Days</th>${col((c) => String(c.days))}</tr><tr><th>kWh</th>${col((c) => kwh(c.kwh))}</tr>
      <tr><th>Avg kWh per day</th>${col((c) => (c.kwh / c.days).toFixed(1))}</tr><tr><th>Avg temperature</th>${col((c) => `${c.temp}&deg;F`)}</tr></table>
    <div class="stub">FERNCASTLE PPD &middot; 61-0094-3 &middot; PAY ${usd(budget)} BY NOV 17 2026 &middot; Enclosed $__________</div>`;
  return {
    name: "ferncastle-ppd-budget-comparison",
    css: `body { font-family: "Liberation Mono", monospace; font-size: 10px; } .top { display: flex; justify-content: space-between; } .name { font-size: 18px; font-weight: bold; }
      .info { text-align: right; } table { border-collapse: collapse; } .acct, .read { width: 100%; margin: 8px 0; } .acct th, .read th { background: #222; color: #fff; font-weight: normal; padding: 3px; }
      .acct td, .read td { border: 1px solid #222; text-align: center; padding: 3px; } .two { display: grid; grid-template-columns: 1.2fr 1fr; gap: 14px; }
      h4 { margin: 12px 0 4px; border-bottom: 1px solid #222; } .ch { width: 100%; } .ch td { padding: 2px 3px; } .n { text-align: right; } .d { color: #555; }
      .t td { border-top: 1px solid #222; font-weight: bold; } .sum { width: 55%; } .small { font-size: 8.5px; } .cmp { width: 70%; } .cmp th, .cmp td { border: 1px solid #999; padding: 3px 6px; text-align: right; }
      .cmp th:first-child { text-align: left; } .stub { margin-top: 60px; border-top: 2px dashed #000; padding-top: 8px; }`,
    pages: [page],
    expected: expected({ start: "2026-09-28", end: "2026-10-28", kwh: used, amountDueCents: budget }, compare),
  };
}

export function kittering(): Bill {
  const meters = [{ id: "K-210448", kind: "General Service", prev: 55_602, pres: 56_517 }, { id: "K-309912", kind: "Controlled Water Heating", prev: 8_114, pres: 8_421 }];
  const [general, controlled] = meters.map((m) => m.pres - m.prev);
  const total = general + controlled;
  const lines = [fixed("Customer Charge - General", 1600), fixed("Customer Charge - Controlled", 450), rated("Energy - General", general, 0.1248), rated("Energy - Controlled", controlled, 0.0721), rated("Transmission Rider", total, 0.0068)];
  const tax = pct("Sales Tax", sum(lines), 6.875);
  const current = sum(lines) + tax.cents;
  const pastDue = 21460 - 11848;
  const late = Math.round(pastDue * 0.015);
  const due = pastDue + late + current;
  const values = [1540, 1811, 1655, 1402, 1118, 986, 1024, 1210, 1296, 1177, 1045, total];
  const days = [31, 32, 29, 30, 30, 29, 31, 30, 31, 32, 28, 29];
  const hist = monthsEnding(2026, 11, values);
  const rows = hist.map((h, i) => `<tr><td>${MON[h.m - 1]}-${String(h.y).slice(2)}</td><td>${days[i]}</td><td>${kwh(h.kwh)}</td><td>${(h.kwh / days[i]).toFixed(1)}</td></tr>`).join("");
  const page = `
    <div class="hdr"><b>KITTERING BAY POWER</b><span>Residential Electric Statement</span></div>
    <div class="alert">FINAL NOTICE &mdash; YOUR ACCOUNT IS PAST DUE. To avoid disconnection, pay at least ${usd(pastDue + late)} by 11/24/2026.</div>
    <div class="row"><div>ELSPETH MORROW-KAINE<br>7731 HERON LOOP<br>KITTERING BAY</div>
      <table class="kv"><tr><td>Account</td><td>55-601-2284</td></tr><tr><td>Bill issued</td><td>November 10, 2026</td></tr><tr><td>Service</td><td>Oct 9 - Nov 7, 2026 (29 days)</td></tr></table></div>
    <div class="row"><div class="left">
      <h4>Account balance</h4><table class="c">
        <tr><td>Previous Balance</td><td class="n">${amt(21460)}</td></tr><tr><td>Payment Received 10/28 - Thank You</td><td class="n">${amt(-11848)}</td></tr>
        <tr class="red"><td>Past Due Amount (due immediately)</td><td class="n">${amt(pastDue)}</td></tr><tr><td>Late Payment Charge 1.5%</td><td class="n">${amt(late)}</td></tr>
        <tr><td>Current Charges (due 12/01/2026)</td><td class="n">${amt(current)}</td></tr>
        <tr class="t"><td>Total Amount Due</td><td class="n">${usd(due)}</td></tr></table>
      <h4>Meters</h4><table class="c g"><tr><th>Meter</th><th>Type</th><th>Previous</th><th>Present</th><th>kWh</th></tr>
        ${meters.map((m) => `<tr><td>${m.id}</td><td>${m.kind}</td><td class="n">${kwh(m.prev)}</td><td class="n">${kwh(m.pres)}</td><td class="n">${kwh(m.pres - m.prev)}</td></tr>`).join("")}
        <tr class="t"><td colspan="4">Total kWh</td><td class="n">${kwh(total)}</td></tr></table>
      <h4>Current charges</h4><table class="c">${lineRows([...lines, tax])}<tr class="t"><td>Total Current Charges</td><td></td><td class="n">${amt(current)}</td></tr></table>
    </div><div class="right"><h4>Usage history (both meters)</h4>
      <table class="c g"><tr><th>Month</th><th>Days</th><th>kWh</th><th>kWh/day</th></tr>${rows}</table></div></div>
    <div class="stub"><span>KITTERING BAY POWER &middot; 55-601-2284</span><span>Total Amount Due ${usd(due)}</span><span>Minimum to avoid disconnection ${usd(pastDue + late)}</span></div>`;
  return {
    name: "kittering-past-due-two-meters",
    css: `body { font-family: "Liberation Sans", sans-serif; font-size: 10px; } .hdr { display: flex; justify-content: space-between; align-items: baseline; border-bottom: 2px solid #333; }
      .hdr b { font-size: 19px; color: #234; } .alert { background: #f6d6d6; border: 2px solid #b00; color: #800; font-weight: bold; padding: 6px; margin: 8px 0; }
      .row { display: flex; justify-content: space-between; gap: 16px; margin-bottom: 6px; } .left { flex: 1.4; } .right { flex: 1; } .kv td { padding: 1px 6px; }
      h4 { margin: 8px 0 3px; font-size: 11px; background: #e6ebf0; padding: 2px 4px; } table { border-collapse: collapse; } .c { width: 100%; } .c td, .c th { padding: 2px 4px; }
      .g th { background: #234; color: #fff; } .g td { border-bottom: 1px solid #ddd; text-align: right; } .g td:first-child { text-align: left; } .n { text-align: right; } .d { color: #666; }
      .t td { font-weight: bold; border-top: 1px solid #333; } .red td { color: #a00; font-weight: bold; } .stub { margin-top: 24px; border-top: 1px dashed #333; padding-top: 8px; display: flex; justify-content: space-between; }`,
    pages: [page],
    expected: expected({ start: "2026-10-09", end: "2026-11-07", kwh: total, amountDueCents: due }, hist),
  };
}

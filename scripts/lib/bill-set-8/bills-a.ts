/**
 * Held-out set 8, bills 1–3: a Kansas-style electric co-op (tiered energy, history newest first
 * with temperatures), a city's combined utility bill over two pages (electric period only as read
 * dates, water gallons nearby, months across), and a community-choice bill whose delivery utility
 * prints the summary and whose time-of-use lines must be added (bar chart with a year row).
 */
import { MON, amt, expected, fixed, kwh, lineRows, monthsEnding, pct, rated, sum, usd, type Bill } from "./common";

export function marlowe(): Bill {
  const used = 59_498 - 58_214;
  const energy = [fixed("Facility Charge", 3200), rated("Energy - First 600 kWh", 600, 0.112), rated("Energy - Over 600 kWh", used - 600, 0.0985), rated("Power Cost Adjustment", used, 0.00715)];
  const elec = sum(energy);
  const taxes = [pct("City Franchise Fee", elec, 3)];
  taxes.push(pct("State Sales Tax", elec + taxes[0].cents, 6.5));
  const current = elec + sum(taxes);
  const roundUp = 21;
  const due = current + roundUp;
  const hist = monthsEnding(2026, 11, [1196, 1642, 1918, 1705, 1233, 902, 1018, 1577, 2104, 1986, 1412, 1036, used]);
  const days = [30, 31, 32, 29, 28, 31, 30, 32, 30, 31, 30, 31, 30];
  const temps = [45, 33, 29, 36, 49, 57, 67, 78, 84, 82, 73, 60, 47];
  const rows = hist.map((h, i) => `<tr><td>${MON[h.m - 1]} ${h.y}</td><td class="n">${days[i]}</td><td class="n">${kwh(h.kwh)}</td><td class="n">${temps[i]}&deg;</td></tr>`).reverse().join("");
  const page = `
    <header><div class="logo">MARLOWE BASIN<br><small>ELECTRIC COOPERATIVE, INC.</small></div>
      <div class="addr">PO Box 418 &middot; Halvern, KS 67420<br>Member Services (785) 555-0148<br>Outages 24/7 (785) 555-0199</div></header>
    <div class="band"><span>MEMBER NUMBER 220-0871-04</span><span>BILL DATE 11/04/2026</span><span>DUE DATE 11/20/2026</span></div>
    <div class="cols"><div>
      <p class="member">DARLA &amp; KEN VOSBURGH<br>1187 RD 9<br>HALVERN KS 67420</p>
      <h3>SERVICE PERIOD</h3><p class="period">10-02-2026 thru 11-01-2026 &nbsp; 30 Days</p>
      <table class="meter"><tr><th>Meter</th><th>Previous</th><th>Present</th><th>Mult</th><th>kWh Used</th></tr>
        <tr><td>40117823</td><td class="n">58,214</td><td class="n">59,498</td><td class="n">1</td><td class="n">${kwh(used)}</td></tr></table>
      <h3>CURRENT CHARGES &mdash; RATE R-1 RESIDENTIAL</h3>
      <table class="ch">${lineRows([...energy, ...taxes])}<tr class="t"><td>Total Current Charges</td><td></td><td class="n">${amt(current)}</td></tr></table>
      <h3>ACCOUNT ACTIVITY</h3>
      <table class="ch"><tr><td>Previous Balance</td><td></td><td class="n">168.40</td></tr><tr><td>Payment Received 10/21/2026 - Thank You</td><td></td><td class="n">-168.40</td></tr>
        <tr><td>Balance Forward</td><td></td><td class="n">0.00</td></tr><tr><td>Current Charges</td><td></td><td class="n">${amt(current)}</td></tr>
        <tr><td>Operation Round Up (voluntary)</td><td></td><td class="n">${amt(roundUp)}</td></tr></table>
      <div class="due"><span>TOTAL AMOUNT DUE</span><b>${usd(due)}</b></div>
      <p class="fine">A late payment charge of 5% will be applied after 11/20/2026. Amount after due date: ${usd(Math.round(due * 1.05))}.<br>
        Capital credits allocated to your account to date: $412.18. Your cooperative returns margins to members.</p>
    </div><div>
      <h3>USAGE HISTORY</h3>
      <table class="hist"><tr><th>Month</th><th>Days</th><th>kWh</th><th>Avg Temp</th></tr>${rows}</table>
      <p class="fine">Average daily use this period: ${(used / 30).toFixed(1)} kWh</p>
    </div></div>
    <div class="stub"><div>RETURN THIS PORTION WITH PAYMENT<br>Member No. 220-0871-04 &nbsp; Due 11/20/2026</div><div>Amount Due <b>${usd(due)}</b><br>Amount Paid $________</div></div>`;
  return {
    name: "marlowe-coop-newest-first",
    css: `body { font-family: "DejaVu Sans", sans-serif; font-size: 10.5px; color: #1b2a1b; }
      header { display: flex; justify-content: space-between; border-bottom: 3px solid #2f6b2f; padding-bottom: 6px; }
      .logo { font-size: 20px; font-weight: bold; color: #2f6b2f; } .logo small { font-size: 10px; letter-spacing: 2px; }
      .addr { text-align: right; } .band { display: flex; justify-content: space-between; background: #e3eee0; padding: 5px 8px; margin: 8px 0; font-weight: bold; }
      .cols { display: grid; grid-template-columns: 1.35fr 1fr; gap: 18px; } h3 { font-size: 11px; margin: 10px 0 4px; color: #2f6b2f; border-bottom: 1px solid #9bb89b; }
      table { width: 100%; border-collapse: collapse; } td, th { padding: 2px 4px; } th { text-align: left; background: #f0f5ee; } .n { text-align: right; } .d { color: #555; }
      .t td { border-top: 1px solid #333; font-weight: bold; } .period { font-size: 12px; font-weight: bold; margin: 2px 0 6px; }
      .hist td, .hist th { border-bottom: 1px solid #dde6da; padding: 3px 6px; } .due { display: flex; justify-content: space-between; border: 2px solid #2f6b2f; padding: 8px; margin-top: 10px; font-size: 14px; font-weight: bold; }
      .fine { font-size: 9px; color: #444; } .stub { margin-top: 40px; border-top: 1px dashed #555; padding-top: 10px; display: flex; justify-content: space-between; font-size: 11px; }`,
    pages: [page],
    expected: expected({ start: "2026-10-02", end: "2026-11-01", kwh: used, amountDueCents: due }, hist),
  };
}

export function quenby(): Bill {
  const used = 21_461 - 20_415;
  const elecLines = [fixed("Customer Charge", 1450), rated("Energy Charge", used, 0.1094), rated("Energy Cost Adjustment", used, 0.0042)];
  elecLines.push(pct("Utility Tax", sum(elecLines), 4));
  const water = [fixed("Water Base Charge (3/4 in)", 1875), rated("Water Usage", 4.3, 4.85, "kgal", 2)];
  const sewer = [fixed("Sewer Base Charge", 2140), rated("Sewer Usage", 4.3, 3.1, "kgal", 2)];
  const services: [string, number][] = [["Electric", sum(elecLines)], ["Water", sum(water)], ["Sewer", sum(sewer)], ["Refuse - 96 gal cart", 1725], ["Stormwater", 680]];
  const current = services.reduce((t, [, c]) => t + c, 0);
  const hist = monthsEnding(2026, 11, [1388, 1521, 1402, 1117, 874, 812, 1164, 1439, 1502, 1226, 958, used]);
  const waterHundreds = [38, 36, 35, 37, 41, 49, 66, 74, 71, 58, 47, 43];
  const head = hist.map((h) => `<th>${MON[h.m - 1]} '${String(h.y).slice(2)}</th>`).join("");
  const page1 = `
    <div class="top"><div><div class="city">CITY OF QUENBY</div><div class="dept">Department of Municipal Utilities &middot; Electric &middot; Water &middot; Sewer &middot; Solid Waste</div></div>
      <div class="box"><div>Account Number</div><b>0048812-007</b><div>Statement Date</div><b>11/20/2026</b></div></div>
    <p class="cust">Service Address: 412 W ORCHARD LN<br>Customer: PRIYA NANDAKUMAR</p>
    <table class="sum"><tr><th colspan="2">Account Summary</th></tr>
      <tr><td>Previous Balance</td><td class="n">${usd(24318)}</td></tr><tr><td>Payment Received 11/02/2026</td><td class="n">${usd(-24318, true)}</td></tr>
      <tr><td>Adjustments</td><td class="n">$0.00</td></tr><tr><td>Balance Carried Forward</td><td class="n">$0.00</td></tr>
      ${services.map(([s, c]) => `<tr><td class="ind">${s}</td><td class="n">${usd(c)}</td></tr>`).join("")}
      <tr class="t"><td>Total Current Charges</td><td class="n">${usd(current)}</td></tr></table>
    <div class="pay"><div>PLEASE PAY</div><div class="big">${usd(current)}</div><div>by 12/10/2026</div></div>
    <p class="note">A 5% penalty is added to unpaid current charges after the due date (${usd(Math.round(current * 1.05))} if paid after 12/10/2026). Detail of each service is on page 2.
      Pay online, by phone at 1-888-555-0173, or at City Hall, 100 Main St.</p>
    <div class="stub"><b>CITY OF QUENBY UTILITIES</b> &middot; Acct 0048812-007 &middot; Due 12/10/2026 &middot; Total Due ${usd(current)} &middot; Amount Enclosed: ____________</div>`;
  const page2 = `
    <h2>Service Detail &mdash; Account 0048812-007 &middot; Page 2 of 2</h2>
    <h3>ELECTRIC &mdash; Residential Service RS</h3>
    <table class="g"><tr><th>Meter</th><th>Previous Read Date</th><th>Present Read Date</th><th>Previous Reading</th><th>Present Reading</th><th>kWh</th></tr>
      <tr><td>E-77120</td><td>10/15/2026</td><td>11/13/2026</td><td class="n">20,415</td><td class="n">21,461</td><td class="n">${kwh(used)}</td></tr></table>
    <table class="l">${lineRows(elecLines)}<tr class="t"><td>Total Electric</td><td></td><td class="n">${amt(sum(elecLines))}</td></tr></table>
    <h3>WATER &amp; SEWER</h3>
    <table class="g"><tr><th>Meter</th><th>Previous Read Date</th><th>Present Read Date</th><th>Previous Reading</th><th>Present Reading</th><th>Gallons</th></tr>
      <tr><td>W-3381</td><td>10/16/2026</td><td>11/14/2026</td><td class="n">612,900</td><td class="n">617,200</td><td class="n">4,300</td></tr></table>
    <table class="l">${lineRows(water)}<tr class="t"><td>Total Water</td><td></td><td class="n">${amt(sum(water))}</td></tr>${lineRows(sewer)}<tr class="t"><td>Total Sewer</td><td></td><td class="n">${amt(sum(sewer))}</td></tr>
      <tr><td>Refuse - 96 gal cart</td><td></td><td class="n">17.25</td></tr><tr><td>Stormwater Utility Fee</td><td></td><td class="n">6.80</td></tr></table>
    <h3>12-MONTH USAGE</h3>
    <table class="h"><tr><th></th>${head}</tr><tr><td>Electric kWh</td>${hist.map((h) => `<td>${kwh(h.kwh)}</td>`).join("")}</tr>
      <tr><td>Water (100 gal)</td>${waterHundreds.map((w) => `<td>${w}</td>`).join("")}</tr></table>`;
  return {
    name: "quenby-city-combined-read-dates",
    css: `body { font-family: "Liberation Serif", serif; font-size: 11px; } .top { display: flex; justify-content: space-between; align-items: flex-start; }
      .city { font-size: 24px; font-weight: bold; letter-spacing: 3px; } .dept { font-size: 10px; } .box { border: 1px solid #000; padding: 6px 10px; text-align: right; }
      table { border-collapse: collapse; } .sum { width: 60%; margin: 14px 0; } .sum th { text-align: left; background: #ddd; padding: 4px; } .sum td { padding: 3px 4px; } .ind { padding-left: 18px !important; }
      .n { text-align: right; } .t td { border-top: 2px solid #000; font-weight: bold; } .pay { position: absolute; right: 0.6in; top: 2.1in; border: 3px double #000; padding: 10px 20px; text-align: center; }
      .big { font-size: 22px; font-weight: bold; } .note { font-size: 10px; } .stub { margin-top: 3in; border-top: 1px dashed #000; padding-top: 8px; }
      h2 { font-size: 13px; } h3 { font-size: 12px; margin: 14px 0 4px; } .g { width: 100%; } .g th, .g td { border: 1px solid #777; padding: 3px; font-size: 10px; }
      .l { width: 70%; margin-top: 4px; } .l td { padding: 2px 4px; } .d { color: #444; } .h { width: 100%; font-size: 9.5px; } .h th, .h td { border: 1px solid #999; padding: 3px 2px; text-align: center; }`,
    pages: [page1, page2],
    expected: expected({ start: "2026-10-15", end: "2026-11-13", kwh: used, amountDueCents: current }, hist),
  };
}

export function tessaly(): Bill {
  const tou: [string, number][] = [["Peak (4 p.m.-9 p.m.)", 148], ["Off-Peak", 312], ["Super Off-Peak (midnight-6 a.m.)", 125]];
  const total = tou.reduce((t, [, k]) => t + k, 0);
  const delivery = [...tou.map(([p, k], i) => rated(`Delivery ${p}`, k, [0.28412, 0.21877, 0.15033][i])), rated("Power Charge Indifference Adj.", total, 0.01902), rated("Base Services Charge", 29, 0.39427, "days")];
  const deliveryTaxes = [pct("Utility Users' Tax", sum(delivery), 5), rated("State Regulatory Fee", total, 0.0003)];
  const deliveryTotal = sum(delivery) + sum(deliveryTaxes);
  const gen = tou.map(([p, k], i) => rated(`Generation ${p}`, k, [0.1421, 0.0964, 0.07315][i]));
  const genTax = pct("Local Utility Users' Tax", sum(gen), 5);
  const genTotal = sum(gen) + genTax.cents;
  const due = deliveryTotal + genTotal;
  const hist = monthsEnding(2026, 11, [612, 688, 731, 640, 598, 541, 563, 702, 866, 914, 788, 622, total]);
  const max = Math.max(...hist.map((h) => h.kwh));
  const bars = hist.map((h) => `<div class="bar"><span>${h.kwh}</span><i style="height:${Math.round((h.kwh / max) * 130)}px"></i><em>${MON[h.m - 1]}</em></div>`).join("");
  const page1 = `
    <div class="hd"><div class="brand">Pelham Valley<br>Electric Delivery</div><div>ENERGY STATEMENT<br>Statement Date: 11/22/2026<br>Due Date: 12/13/2026<br>Account No: 7720 441 903-6</div></div>
    <p>Service For:<br>OWEN CASTELLANOS<br>58 TIDEPOOL CT, SAN ARDO VISTA</p>
    <div class="panel"><h4>Your Account Summary</h4><table>
      <tr><td>Amount Due on Previous Statement</td><td class="n">$184.22</td></tr><tr><td>Payment(s) Received Since Last Statement</td><td class="n">-184.22</td></tr>
      <tr><td>Previous Unpaid Balance</td><td class="n">$0.00</td></tr><tr><td>Current PVE Electric Delivery Charges</td><td class="n">${usd(deliveryTotal)}</td></tr>
      <tr><td>Tessaly Coast Community Energy Electric Generation Charges</td><td class="n">${usd(genTotal)}</td></tr>
      <tr class="t"><td>Total Amount Due by 12/13/2026</td><td class="n">${usd(due)}</td></tr></table></div>
    <p class="small">Your electric generation is provided by Tessaly Coast Community Energy, your local not-for-profit community choice program. Pelham Valley Electric Delivery delivers it over its wires and bills on its behalf.</p>
    <div class="panel"><h4>Electric Delivery &mdash; Rate Schedule E-TOU5</h4>
      <p>Billing Period: Oct 21, 2026 &ndash; Nov 19, 2026 (29 billing days)<br>Meter #1009 552 817 &middot; Serial T</p>
      <p class="small">Time-of-use meter: energy is recorded in each period below. See page 2 for charges.</p>
      <table>${tou.map(([p, k]) => `<tr><td>${p}</td><td class="n">${kwh(k)} kWh</td></tr>`).join("")}</table></div>`;
  const page2 = `
    <div class="panel"><h4>Details of PVE Electric Delivery Charges &middot; 10/21/2026 - 11/19/2026</h4>
      <table>${lineRows(delivery)}${lineRows(deliveryTaxes)}<tr class="t"><td>Total PVE Electric Delivery Charges</td><td></td><td class="n">${usd(deliveryTotal)}</td></tr></table></div>
    <div class="panel"><h4>Tessaly Coast Community Energy &middot; Generation &middot; Plan: CoastBasic (48% renewable)</h4>
      <table>${lineRows([...gen, genTax])}<tr class="t"><td>Total Generation Charges</td><td></td><td class="n">${usd(genTotal)}</td></tr></table>
      <p class="small">Questions about generation charges: Tessaly Coast Community Energy, 1-877-555-0140.</p></div>
    <div class="panel"><h4>Monthly Usage (kWh)</h4><div class="chart">${bars}</div>
      <div class="years"><span style="flex:2">2025</span><span style="flex:11">2026</span></div>
      <p class="small">Average daily usage this period: ${(total / 29).toFixed(1)} kWh &middot; Same period last year: 612 kWh</p></div>`;
  return {
    name: "tessaly-cca-tou-two-page",
    css: `body { font-family: "Liberation Sans", sans-serif; font-size: 10.5px; color: #123; } .hd { display: flex; justify-content: space-between; border-bottom: 4px solid #0b5394; padding-bottom: 6px; }
      .brand { font-size: 20px; font-weight: bold; color: #0b5394; } .panel { border: 1px solid #9fb7d1; border-radius: 6px; padding: 6px 10px; margin: 10px 0; }
      h4 { margin: 0 0 6px; background: #0b5394; color: #fff; padding: 3px 6px; font-size: 11px; } table { width: 100%; border-collapse: collapse; } td { padding: 2px 4px; }
      .n { text-align: right; } .d { color: #567; } .t td { border-top: 1px solid #123; font-weight: bold; } .small { font-size: 9px; color: #345; }
      .chart { display: flex; align-items: flex-end; height: 170px; gap: 6px; padding: 0 4px; } .bar { flex: 1; display: flex; flex-direction: column; align-items: center; justify-content: flex-end; height: 100%; }
      .bar i { display: block; width: 70%; background: #6fa8dc; } .bar span { font-size: 9px; margin-bottom: 2px; } .bar em { font-style: normal; font-size: 9.5px; margin-top: 3px; }
      .years { display: flex; text-align: center; font-weight: bold; border-top: 1px solid #9fb7d1; margin: 2px 4px 0; } .years span { border-right: 1px solid #9fb7d1; }`,
    pages: [page1, page2],
    expected: expected({ start: "2026-10-21", end: "2026-11-19", kwh: total, amountDueCents: due }, hist),
  };
}

/**
 * Held-out set 8, bills 7–8: an electric membership corporation with an estimated present reading
 * (period only from the two read dates), a capital-credit refund that lowers the amount due and a
 * bar chart labelled with month initials over a year row; and a two-page gas-and-electric bill
 * with a third-party electricity supplier, therms beside kWh, and a history on page 2 whose rows
 * are labelled by their read dates.
 */
import { MON, amt, daysBetween, expected, fixed, kwh, lineRows, monthsEnding, pct, rated, sum, usd, type Bill } from "./common";

export function ambrose(): Bill {
  const used = 968;
  const lines = [fixed("Basic Charge", 2995), rated("Winter Energy 0-800 kWh", 800, 0.1089, "kWh", 4), rated("Winter Energy over 800 kWh", used - 800, 0.0921, "kWh", 4), rated("Wholesale Power Cost Adj.", used, -0.0042, "kWh", 4), fixed("Environmental Compliance", 200)];
  const taxes = [pct("County Sales Tax", sum(lines), 3), pct("State Sales Tax", sum(lines), 4)];
  const current = sum(lines) + sum(taxes);
  const credit = -1844;
  const due = current + credit;
  const hist = monthsEnding(2026, 11, [874, 1302, 1466, 1218, 905, 711, 802, 1340, 1611, 1574, 1129, 833, used]);
  const max = Math.max(...hist.map((h) => h.kwh));
  const bars = hist.map((h) => `<div class="b"><small>${kwh(h.kwh)}</small><i style="height:${Math.round((h.kwh / max) * 110)}px"></i><u>${MON[h.m - 1][0]}</u></div>`).join("");
  const page = `
    <table class="head"><tr><td class="org">Ambrose Hill<br>Electric Membership Corporation</td><td class="meta">Billing Date: Nov 24, 2026<br>Account: 104-3380-02<br>Due Date: Dec 14, 2026</td></tr></table>
    <p>TOBIAS &amp; RUTH ABERNATHY-LOWE &middot; 3150 SPRING CREEK CHURCH RD</p>
    <div class="est">This bill is based on an ESTIMATED meter reading. Your meter could not be read this month; the difference is corrected when it is read.</div>
    <table class="g"><tr><th>Meter No.</th><th>Previous Reading</th><th>Date</th><th>Type</th><th>Present Reading</th><th>Date</th><th>Type</th><th>kWh</th></tr>
      <tr><td>7704219</td><td>41,083</td><td>10/22/2026</td><td>Actual</td><td>42,051</td><td>11/22/2026</td><td>Estimated</td><td>${kwh(used)} E</td></tr></table>
    <div class="cols"><div>
      <h4>Charges &mdash; Schedule RS, Winter (October-May)</h4>
      <table class="c">${lineRows([...lines, ...taxes])}<tr class="t"><td>Current Month Charges</td><td></td><td class="n">${amt(current)}</td></tr></table>
      <h4>Account</h4><table class="c">
        <tr><td>Previous Balance</td><td class="n">122.31</td></tr><tr><td>Payment Nov 3 - Thank You</td><td class="n">-122.31</td></tr>
        <tr><td>Current Month Charges</td><td class="n">${amt(current)}</td></tr><tr><td>Capital Credit Retirement applied to bill</td><td class="n">${amt(credit)}</td></tr>
        <tr class="t big"><td>Total Due</td><td class="n">${usd(due)}</td></tr></table>
    </div><div>
      <h4>kWh Usage &mdash; Last 13 Months</h4><div class="chart">${bars}</div>
      <div class="yr"><span style="flex:2">2025</span><span style="flex:11">2026</span></div>
      <p class="s">Days this bill: 31 &middot; Average kWh per day: ${(used / 31).toFixed(1)}</p>
    </div></div>
    <div class="stub">Ambrose Hill EMC &middot; Account 104-3380-02 &middot; Total Due ${usd(due)} by Dec 14, 2026</div>`;
  return {
    name: "ambrose-emc-estimated-initials-chart",
    css: `body { font-family: "DejaVu Serif", serif; font-size: 10px; color: #222; } .head { width: 100%; border-bottom: 2px solid #6b4f1d; } .org { font-size: 17px; font-weight: bold; color: #6b4f1d; }
      .meta { text-align: right; } .est { border: 1px solid #c90; background: #fff6dd; padding: 5px; margin: 6px 0; font-weight: bold; }
      table { border-collapse: collapse; } .g { width: 100%; } .g th { font-size: 8.5px; background: #efe6d2; } .g th, .g td { border: 1px solid #b9a57a; padding: 3px; text-align: center; }
      .cols { display: grid; grid-template-columns: 1.1fr 1fr; gap: 16px; } h4 { font-size: 11px; margin: 10px 0 4px; color: #6b4f1d; } .c { width: 100%; } .c td { padding: 2px 3px; }
      .n { text-align: right; } .d { color: #666; font-size: 9px; } .t td { border-top: 1px solid #222; font-weight: bold; } .big td { font-size: 13px; }
      .chart { display: flex; align-items: flex-end; height: 140px; gap: 3px; } .b { flex: 1; display: flex; flex-direction: column; align-items: center; justify-content: flex-end; height: 100%; }
      .b i { display: block; width: 80%; background: #b58b3a; } .b small { font-size: 9px; } .b u { text-decoration: none; margin-top: 2px; font-weight: bold; }
      .yr { display: flex; text-align: center; border-top: 1px solid #6b4f1d; font-weight: bold; font-size: 11px; } .s { font-size: 9px; } .stub { margin-top: 40px; border-top: 1px dashed #555; padding-top: 8px; }`,
    pages: [page],
    expected: expected({ start: "2026-10-22", end: "2026-11-22", kwh: used, amountDueCents: due }, hist),
  };
}

const iso = (mdy: string) => `20${mdy.slice(6)}-${mdy.slice(0, 2)}-${mdy.slice(3, 5)}`;

export function wendmere(): Bill {
  const used = 14_894 - 14_206;
  const delivery = [fixed("Customer Charge", 1700), rated("Distribution", used, 0.07911), rated("Transmission", used, 0.02655), rated("System Benefits Charge", used, 0.00893)];
  const supply = [rated("Electricity Supply - Fixed Price Plan", used, 0.1149)];
  const therms = 62;
  const gas = [fixed("Gas Customer Charge", 1325), rated("Gas Distribution", therms, 0.612, "therms", 4), rated("Gas Supply", therms, 0.5587, "therms", 4)];
  const gift = 100;
  const current = sum(delivery) + sum(supply) + sum(gas);
  const due = current + gift;
  const reads = ["11/03/25", "12/03/25", "01/05/26", "02/03/26", "03/05/26", "04/03/26", "05/05/26", "06/03/26", "07/03/26", "08/04/26", "09/02/26", "10/02/26", "11/03/26", "12/02/26"];
  const k = [702, 811, 764, 690, 611, 574, 633, 824, 906, 871, 742, 655, used];
  const th = [88, 141, 167, 139, 102, 61, 33, 19, 16, 17, 22, 41, therms];
  const temp = [41, 30, 27, 33, 42, 53, 63, 72, 77, 75, 66, 54, 43];
  const rows = k.map((v, i) => `<tr><td>${reads[i + 1]}</td><td>${daysBetween(iso(reads[i]), iso(reads[i + 1]))}</td><td>${kwh(v)}</td><td>${th[i]}</td><td>${temp[i]}</td></tr>`).join("");
  const hist = k.map((v, i) => ({ key: `20${reads[i + 1].slice(6)}-${reads[i + 1].slice(0, 2)}`, kwh: v }));
  const page1 = `
    <div class="band"><div class="nm">Wendmere Gas &amp; Electric</div><div>Account 9 4410 2231 0087<br>Statement date December 3, 2026</div></div>
    <div class="wrap"><div>
      <p><b>MARGUERITE O'SHEA-DUNMORE</b><br>26 LANTERN HILL RD, APT 2<br>NORTH WENDMERE</p>
      <p>Billing period: November 3, 2026 to December 2, 2026 &mdash; 29 days<br>Next scheduled read: on or about January 4, 2027</p>
      <h3>Summary of charges</h3><table class="s">
        <tr><td>Balance from last bill</td><td>${usd(19845)}</td></tr><tr><td>Payment received Nov 20 &mdash; thank you</td><td>${usd(-19845)}</td></tr><tr><td>Balance forward</td><td>$0.00</td></tr>
        <tr><td>Electricity delivery (Wendmere)</td><td>${usd(sum(delivery))}</td></tr><tr><td>Electricity supply (Bellwin Energy Services)</td><td>${usd(sum(supply))}</td></tr>
        <tr><td>Natural gas (Wendmere)</td><td>${usd(sum(gas))}</td></tr><tr><td>Warm Neighbors fund contribution (thank you)</td><td>${usd(gift)}</td></tr>
        <tr class="t"><td>Total amount due</td><td>${usd(due)}</td></tr></table>
    </div><div class="due"><div>Total amount due</div><div class="big">${usd(due)}</div><div>due by Dec 28, 2026</div><hr><div class="sm">Your electricity used this period<br><b>${kwh(used)} kWh</b></div><div class="sm">Your gas used this period<br><b>${therms} therms</b></div></div></div>
    <p class="sm">Electricity supply is provided by Bellwin Energy Services under the plan you chose (fixed 11.49&cent;/kWh through 06/2027). Questions about supply: 1-866-555-0152. Wendmere remains responsible for delivery and emergencies: 1-800-555-0111.</p>
    <div class="stub"><span>Wendmere Gas &amp; Electric &middot; Account 9 4410 2231 0087</span><span>Amount due ${usd(due)}</span></div>`;
  const page2 = `
    <div class="band"><div class="nm">Wendmere Gas &amp; Electric</div><div>Page 2 of 2</div></div>
    <h3>Electricity &mdash; Residential Service SC1 &middot; Meter 88213047</h3>
    <table class="g"><tr><th>Read date</th><th>Reading</th><th>Type</th></tr><tr><td>Nov 3, 2026</td><td>14,206</td><td>Actual</td></tr><tr><td>Dec 2, 2026</td><td>14,894</td><td>Actual</td></tr>
      <tr class="t"><td colspan="2">Electricity used</td><td>${kwh(used)} kWh</td></tr></table>
    <table class="l">${lineRows(delivery)}<tr class="t"><td>Total delivery charges</td><td></td><td>${usd(sum(delivery))}</td></tr>${lineRows(supply)}<tr class="t"><td>Total supply charges</td><td></td><td>${usd(sum(supply))}</td></tr></table>
    <h3>Natural gas &mdash; Residential Heating &middot; Meter G-4410392</h3>
    <p>Usage 60 CCF &middot; therm factor 1.0333 &middot; therms billed ${therms}</p>
    <table class="l">${lineRows(gas)}<tr class="t"><td>Total gas charges</td><td></td><td>${usd(sum(gas))}</td></tr></table>
    <h3>Your usage history</h3>
    <table class="g h"><tr><th>Read date</th><th>Days</th><th>Electricity kWh</th><th>Gas therms</th><th>Avg temp &deg;F</th></tr>${rows}</table>`;
  return {
    name: "wendmere-gas-electric-read-date-history",
    css: `body { font-family: "Liberation Sans", sans-serif; font-size: 10.5px; color: #1d1d3a; } .band { display: flex; justify-content: space-between; background: #34346b; color: #fff; padding: 8px 12px; }
      .nm { font-size: 18px; font-weight: bold; } .wrap { display: grid; grid-template-columns: 1.5fr 1fr; gap: 16px; } h3 { font-size: 12px; color: #34346b; margin: 12px 0 4px; }
      table { border-collapse: collapse; } .s { width: 100%; } .s td { padding: 3px 4px; border-bottom: 1px solid #e3e3ef; } .s td:last-child, .l td:last-child { text-align: right; }
      .t td { font-weight: bold; border-top: 2px solid #34346b; } .due { border: 2px solid #34346b; padding: 10px; margin-top: 12px; text-align: center; } .big { font-size: 26px; font-weight: bold; }
      .sm { font-size: 9px; margin: 6px 0; } .stub { margin-top: 3.4in; border-top: 1px dashed #333; padding-top: 8px; display: flex; justify-content: space-between; }
      .g { width: 70%; } .g th { background: #e3e3ef; padding: 3px; } .g td { padding: 2px 6px; border-bottom: 1px solid #e3e3ef; text-align: right; } .g td:first-child { text-align: left; }
      .l { width: 85%; } .l td { padding: 2px 4px; } .d { color: #555; } .h { width: 80%; }`,
    pages: [page1, page2],
    expected: expected({ start: "2026-11-03", end: "2026-12-02", kwh: used, amountDueCents: due }, hist),
  };
}

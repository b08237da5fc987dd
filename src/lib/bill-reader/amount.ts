// The amount due: the figure a printed label names as what to pay now, never the previous
// balance, a payment received, taxes, fixed charges, a budget-billing amount or a late-payment
// amount printed beside it. Every other labelled amount is kept as an alternative for the rep.
// "Remit" wording ("PLEASE REMIT", "Remittance amount") names the amount to pay as "amount due"
// does, so a figure without "$" under it counts too.
import { center, type Line } from "./layout";
import { whereOf, type Confidence, type Found } from "./types";

const MONEY = /(?<![\d.,])(-?\$\s?-?\d{1,3}(?:,\d{3})*\.\d{2}|-?\$\s?\d+\.\d{2}|\d{1,3}(?:,\d{3})*\.\d{2}(?!\d))(\s*CR\b)?/g;
const DUE =
  /\b(total\s+)?amount\s+(now\s+)?due\b|\btotal\s+(amount\s+)?due\b|\bbalance\s+due\b|\bplease\s+pay\b|\bpay\s+this\s+amount\b|\bamount\s+(to\s+pay|owed|you\s+owe)\b|\btotal\s+to\s+pay\b|\bnow\s+due\b|\bdue\s+(by|on)\b|\bpay\s+by\b|\byou\s+owe\b|\bremit(tance)?\b|\b(amount|total)\s+payable\b|\bpayable\s+(now|by)\b|\b(total|importe|monto|cantidad|saldo)\s+a\s+pagar\b|\bmontant\s+(à|a)\s+payer\b/i;
const MAYBE = /\bnew\s+balance\b|\btotal\s+(current\s+|new\s+)?charges\b|\btotal\s+bill\b|\baccount\s+balance\b|\bcurrent\s+bill\b|\bbalance\b|\btotal\b/i;
const NOT_DUE =
  /\b(previous|prior|last)\b|\bpayments?\b|\bpaid\b|\breceived\b|\bthank|\btax(es)?\b|\bbasic\b|\bcustomer\s+charge|\bservice\s+charge|\bfixed\b|\bfacilit|\bbudget\b|\blevel(ized)?\b|\baverage\b|\bpast\s+due\b|\blate\b|\bafter\b|\bcredit\b|\badjust|\bdeposit\b|\bfees?\b|\brider\b|\benergy\s+charge|\bdelivery\b|\bsupply\b|\bgenerat|\btransmission\b|\bdistribution\b|\brate\b|\bsubtotal\b|\bsub-total\b|\bdonat|\bround\s*up\b|\bsurcharge\b|\bmonthly\s+charge\b|\bminimum\b|\banterior\b|\bpagos?\s+recibido|\bimpuestos?\b|\bcargo\s+(b[aá]sico|fijo)|\bvencid[oa]\b/i;

type Candidate = {
  cents: number;
  line: Line;
  score: number;
  label: string;
  size: number;
};

function cents(token: string, credit: boolean): number {
  const n = Math.round(Number(token.replace(/[$,\s]/g, "")) * 100);
  return credit ? -Math.abs(n) : n;
}

function scoreLabel(label: string): number {
  // On budget billing the budget amount is what is due: "Your budget amount due" names it.
  if (DUE.test(label)) return NOT_DUE.test(label.replace(/\bbudget\b/gi, "")) ? -3 : 5;
  if (NOT_DUE.test(label)) return -3;
  if (MAYBE.test(label)) return 2;
  return 0;
}

/** The label above a value in a box or a column ("AMOUNT DUE" over "$142.91"). */
/** A due date printed under the label ("BY NOV 22, 2026"): the label is the line above it. */
const BY_DATE = /^(by|before|on)\s+\S.*\d/i;

function labelAbove(lines: Line[], i: number, x: number): string {
  let below = "";
  for (let k = i - 1; k >= Math.max(0, i - 3) && lines[k].page === lines[i].page; k--) {
    const cell = lines[k].cells.find((c) => Math.abs(center(c) - x) < Math.max(50, (c.xEnd - c.x) / 2 + 10));
    const money = cell ? MONEY.test(cell.text) : false;
    MONEY.lastIndex = 0;
    if (cell && !money && BY_DATE.test(cell.text) && !below) below = cell.text;
    else if (cell && !money) return below ? `${cell.text} ${below}` : cell.text;
    else if (!below && k < i - 1) break;
  }
  return below;
}

function lineCandidates(lines: Line[], i: number): Candidate[] {
  const line = lines[i];
  const out: Candidate[] = [];
  for (const cell of line.cells) {
    let from = 0;
    for (const m of cell.text.matchAll(MONEY)) {
      const plain = !m[1].includes("$");
      let label = cell.text.slice(from, m.index).trim();
      from = (m.index ?? 0) + m[0].length;
      const cellIndex = line.cells.indexOf(cell);
      if (label === "" && cellIndex > 0 && !MONEY.test(line.cells[cellIndex - 1].text)) label = line.cells[cellIndex - 1].text;
      MONEY.lastIndex = 0;
      if (label === "") label = labelAbove(lines, i, center(cell));
      const score = scoreLabel(label) - (plain ? 1 : 0);
      if (plain && score < 4) continue; // a bare 12.34 without a "$" counts only under a strong label
      out.push({
        cents: cents(m[1], !!m[2]),
        line,
        score,
        label,
        size: line.h,
      });
    }
  }
  return out;
}

export type AmountRead = {
  amountDue: Found<number> | null;
  alternatives: Found<number>[];
  warnings: string[];
};

const money = (c: number) => `$${(c / 100).toLocaleString("en-US", { minimumFractionDigits: 2, maximumFractionDigits: 2 })}`;

/** The amount due, from lines without the usage history. */
export function readAmount(lines: Line[]): AmountRead {
  const all = lines.flatMap((_, i) => lineCandidates(lines, i));
  const ranked = all.filter((c) => c.score >= 2).sort((a, b) => b.score - a.score || b.size - a.size || a.line.page - b.line.page || a.line.line - b.line.line);
  const warnings: string[] = [];
  const best = ranked[0];
  const found = (c: Candidate, confidence: Confidence): Found<number> => ({
    value: c.cents,
    where: whereOf(c.line),
    confidence,
    label: c.label,
  });
  const seen = new Set<number>();
  const others = ranked.filter((c) => c !== best && c.cents !== best?.cents && !seen.has(c.cents) && seen.add(c.cents));
  if (!best) return { amountDue: null, alternatives: [], warnings };
  const rivals = others.filter((c) => c.score === best.score);
  const confidence: Confidence = best.score >= 5 && !rivals.length ? "high" : best.score >= 5 ? "medium" : "low";
  if (confidence !== "high") {
    warnings.push(
      `The amount due is not certain: ${money(best.cents)} (“${best.label}”)${
        others.length
          ? `, or ${others
              .slice(0, 3)
              .map((c) => `${money(c.cents)} (“${c.label}”)`)
              .join(", ")}`
          : ""
      }. Pick the one to pay now.`,
    );
  }
  return {
    amountDue: found(best, confidence),
    alternatives: others.slice(0, 4).map((c) => found(c, "low")),
    warnings,
  };
}

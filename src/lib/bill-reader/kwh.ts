// The period's kWh: a labelled figure ("Energy used 972 kWh", "Total kWh 972"), the kWh column
// of a meter table, or, on a time-of-use bill, the sum of its on-/off-peak lines. Rates
// ("$0.12/kWh"), averages and last year's figures are not the period's use.
import { center, type Line } from "./layout";
import { NUMBER, toNumber, whereOf, type Confidence, type Found } from "./types";

type Candidate = { kwh: number; line: Line; score: number; tou?: string };

const STRONG =
  /\b(kilowatt[\s-]*hours?\s+(used|billed|consumed)|total\s+kwh|kwh\s+(used|usage|billed|consumed|(for\s+)?this\s+(period|month|bill|cycle))|energy\s+(used|usage|consumed|use)|total\s+(energy\s+)?(usage|use|consumption)|electricity\s+used|usage\s+this\s+(period|month|bill)|you\s+used|net\s+(energy|usage|kwh)|billed\s+(usage|kwh)|total\s+energy|consumption)\b/i;
const NOT_PERIOD =
  /\b(average|avg|per\s+day|daily|a\s+day|last\s+(year|month|bill)|same\s+(month|period)|previous\s+(year|month|bill)|a\s+year\s+ago|compared|year\s+to\s+date|annual|12[- ]month|neighbou?rs?|similar\s+homes|exported|sent\s+to|delivered\s+to|generat)/i;
const RATE = /[$¢]\s*\d*\.?\d+\s*(\/|per)\s*kwh|\/\s*kwh|per\s+kwh/i;
const TOU = /\b((on|off|mid|super[\s-]+off|partial)[\s-]*)?peak\b|\bshoulder\b/i;
const HEADER = /^(kwh\s+used|usage\s*\(kwh\)|total\s+kwh|kwh|energy\s*\(kwh\)|kwh\s+usage|usage|consumption|kwh\s+billed|total\s+usage)$/i;
const KWH_AFTER = new RegExp(String.raw`(?<![\d.,$])(${NUMBER})\s*kwh\b(?!\s*(\/|per\b))`, "gi");
const LABEL_THEN_NUMBER = new RegExp(String.raw`(${STRONG.source})[^\d$]{0,30}?(?<![\d.,$])(${NUMBER})(?![\d.,]*\s*(\/|per|¢|days?\b))`, "i");

function lineCandidates(line: Line): Candidate[] {
  const t = line.text;
  const out: Candidate[] = [];
  const bad = NOT_PERIOD.test(t) ? -4 : 0;
  const tou = t
    .match(TOU)?.[0]
    .toLowerCase()
    .replace(/[\s-]+/g, "-");
  const labelled = t.match(LABEL_THEN_NUMBER);
  if (labelled) out.push({ kwh: toNumber(labelled.at(-2)!), line, score: 3 + bad });
  for (const m of t.matchAll(KWH_AFTER)) {
    const kwh = toNumber(m[1]);
    if (out.some((c) => c.kwh === kwh)) continue;
    const priced = /@|x\s*\$|×/.test(t);
    out.push({
      kwh,
      line,
      score: (STRONG.test(t) ? 3 : priced ? 1 : 1.5) + bad,
      tou,
    });
  }
  if (tou && !out.length && !RATE.test(t)) {
    // "On-peak  312" in a kWh column of a meter table: the number after the label.
    const n = t.slice((t.match(TOU)?.index ?? 0) + (t.match(TOU)?.[0].length ?? 0)).match(new RegExp(String.raw`(?<![\d.,$])(${NUMBER})(?![\d.,]*\s*(%|¢|\/))`));
    if (n && !t.includes("$")) out.push({ kwh: toNumber(n[1]), line, score: 1 + bad, tou });
  }
  return out.map((c) => (tou && !c.tou && !STRONG.test(t.replace(TOU, "")) ? { ...c, tou } : c));
}

/** A meter table: a kWh column header with the figure below it. */
function columnCandidates(lines: Line[]): Candidate[] {
  const out: Candidate[] = [];
  lines.forEach((line, i) => {
    line.cells.forEach((cell) => {
      if (!HEADER.test(cell.text.trim())) return;
      const half = Math.max(30, (cell.xEnd - cell.x) / 2 + 12);
      for (let k = i + 1; k < Math.min(lines.length, i + 6) && lines[k].page === line.page; k++) {
        // The cell most nearly under the header: a narrow neighbouring column ("Multiplier 5") may also sit within reach.
        const below = lines[k].cells.filter((x) => Math.abs(center(x) - center(cell)) < half).sort((a, b) => Math.abs(center(a) - center(cell)) - Math.abs(center(b) - center(cell)))[0];
        const n = below?.text.match(new RegExp(String.raw`^(${NUMBER})(\s*kwh)?$`, "i"));
        if (!n) continue;
        const tou = lines[k].text
          .match(TOU)?.[0]
          .toLowerCase()
          .replace(/[\s-]+/g, "-");
        const total = /total/i.test(lines[k].cells[0]?.text ?? "");
        out.push({
          kwh: toNumber(n[1]),
          line: lines[k],
          score: tou && !total ? 2 : 3,
          tou: total ? undefined : tou,
        });
      }
    });
  });
  return out;
}

export type KwhRead = { kwh: Found<number> | null; warnings: string[] };

/** The period's kWh, from lines without the usage history. */
export function readKwh(lines: Line[]): KwhRead {
  const all = [...lines.flatMap(lineCandidates), ...columnCandidates(lines)].filter((c) => c.kwh > 0 && c.kwh < 100_000);
  const warnings: string[] = [];
  // Time of use: one figure per period class (the best placed, the first on a tie), summed.
  const byClass = new Map<string, Candidate>();
  for (const c of all) if (c.tou && c.score > 0 && (byClass.get(c.tou)?.score ?? 0) < c.score) byClass.set(c.tou, c);
  const totals = all.filter((c) => !c.tou && c.score >= 3);
  if (byClass.size >= 2) {
    const parts = [...byClass.values()];
    const sum = Math.round(parts.reduce((s, c) => s + c.kwh, 0) * 100) / 100;
    const total = totals.find((c) => Math.abs(c.kwh - sum) < 0.5);
    if (total)
      return {
        kwh: {
          value: total.kwh,
          where: whereOf(total.line),
          confidence: "high",
          label: "total",
        },
        warnings,
      };
    if (!totals.length) {
      return {
        kwh: {
          value: sum,
          where: whereOf(parts[0].line),
          confidence: "high",
          label: `sum of ${parts.map((p) => p.tou).join(" + ")}`,
        },
        warnings,
      };
    }
  }
  const ranked = all.filter((c) => !c.tou || byClass.size < 2).sort((a, b) => b.score - a.score);
  const best = ranked[0];
  if (!best || best.score <= 0) return { kwh: null, warnings };
  const rivals = ranked.filter((c) => c.score === best.score && c.kwh !== best.kwh);
  const confidence: Confidence = best.score >= 3 && !rivals.length ? "high" : best.score >= 2 ? "medium" : "low";
  if (rivals.length) warnings.push(`More than one kWh figure could be this period's: ${[best, ...rivals].map((c) => c.kwh.toLocaleString("en-US")).join(", ")}. Check the bill.`);
  return {
    kwh: { value: best.kwh, where: whereOf(best.line), confidence },
    warnings,
  };
}

const ESTIMATED = /\bestimated\b|\best\.?\s+read|\bread(ing)?\s+type\s*:?\s*(e|est)\b/i;
const LEGEND = /\b[A-Z]\s*[=:-]\s*estimated\b|\bif\s+estimated\b|\bestimated\s+(annual|savings|payment|tax)/i;

/** Whether the bill says its reading was estimated (not a legend explaining the word). */
export function readEstimated(lines: Line[]): Line | null {
  for (let i = 0; i < lines.length; i++) {
    const l = lines[i];
    if (LEGEND.test(l.text)) continue;
    if (ESTIMATED.test(l.text) && /read|meter|usage|kwh|type/i.test(l.text + " " + (lines[i - 1]?.text ?? ""))) return l;
    // A read-type column: "Estimated" / "E" under its header.
    const header = l.cells.find((c) => /^(read(ing)?\s+(type|code)|type\s+of\s+read|reading)$/i.test(c.text));
    if (header && lines[i + 1]) {
      const below = lines[i + 1].cells.find((c) => Math.abs(center(c) - center(header)) < 30);
      if (below && /^(e|est\.?|estimated)$/i.test(below.text)) return lines[i + 1];
    }
  }
  return null;
}

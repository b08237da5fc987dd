// The period's kWh: a labelled figure ("Energy used 972 kWh", "Total kWh 972"), the kWh column
// of a meter table, or, on a time-of-use bill, the sum of its on-/off-peak lines. Rates
// ("$0.12/kWh"), averages and last year's figures are not the period's use.
import { center, type Line } from "./layout";
import { NUMBER, toNumber, whereOf, type Confidence, type Found } from "./types";

/** `flow`: on a net-metering bill, which way the figure went (from the grid, to it, or the net of both). */
type Flow = "from-grid" | "to-grid" | "net";
type Candidate = { kwh: number; line: Line; score: number; tou?: string; flow?: Flow; tier?: boolean };

const STRONG =
  /\b(kilowatt[\s-]*hours?\s+(used|billed|consumed)|total\s+kwh|kwh\s+(used|usage|billed|consumed|(for\s+)?this\s+(period|month|bill|cycle))|energy\s+(used|usage|consumed|use)|total\s+(energy\s+)?(usage|use|consumption)|electricity\s+used|usage\s+this\s+(period|month|bill)|you\s+used|net\s+(energy|usage|kwh)|billed\s+(usage|kwh)|total\s+energy|consumption|consumo|energ[ií]a\s+(usada|consumida|utilizada)|kwh\s+(usados|consumidos|utilizados)|uso\s+de\s+energ[ií]a|consommation|[ée]nergie\s+consomm[ée]e)(?![\p{L}])/iu;
const NOT_PERIOD =
  /\b(average|avg|per\s+day|daily|a\s+day|last\s+(year|month|bill)|same\s+(month|period)|previous\s+(year|month|bill)|a\s+year\s+ago|compared|year\s+to\s+date|annual|12[- ]month|neighbou?rs?|similar\s+homes|exported|sent\s+to|delivered\s+to\s+(the\s+)?(grid|utility)|generat)/i;
const RATE = /[$¢]\s*\d*\.?\d+\s*(\/|per)\s*kwh|\/\s*kwh|per\s+kwh/i;
const TOU = /\b((on|off|mid|super[\s-]+off|partial)[\s-]*)?peak\b|\bshoulder\b/i;
const HEADER_WORDS = /^(kwh\s+used|usage\s*\(?kwh\)?|total\s+kwh|kwh|energy\s*\(kwh\)|kwh\s+usage|usage|consumption|kwh\s+billed|total\s+usage|consumo(\s*\(?kwh\)?)?|kwh\s+(consumidos|usados)|uso(\s*\(?kwh\)?)?)$/iu;
/** A column heading for the period's kWh; a bilingual one ("Consumo / Usage kWh") when one of its halves is. */
const isKwhHeader = (text: string) => text.split(/\s*\/\s*/).some((part) => HEADER_WORDS.test(part.trim()));
// The figure touches its unit (at most one space): "N-20511  kWh delivered" is a meter number, then a heading.
const KWH_AFTER = new RegExp(String.raw`(?<![\d.,$])(${NUMBER}) ?kwh\b(?!\s*(\/|per\b))`, "gi");
const LABEL_THEN_NUMBER = new RegExp(String.raw`(${STRONG.source})[^\d$]{0,30}?(?<![\d.,$])(${NUMBER})(?![\d.,]*\s*(\/|per|¢|days?\b))`, "iu");

// Net metering: the household buys from the grid and sends solar to it. The period's kWh is what
// was delivered from the grid (what the household used of the utility's energy), not the net.
const FROM_GRID = /\bdelivered\b(?!\s+to\s+(the\s+)?(grid|utility))|\bfrom\s+(the\s+)?(grid|utility)\b|\bimported\b|\bpurchased\b|\bentregad[ao]s?\b|\bdel\s+red\b/i;
const TO_GRID = /\b(received|returned|exported|sent|recibid[ao]s?|devuelt[ao]s?)\b(?!\s+from\s+(the\s+)?(grid|utility))|\bto\s+(the\s+)?grid\b|\bdelivered\s+to\s+(the\s+)?(grid|utility)\b|\bexcess\s+generation\b|\ba\s+la\s+red\b/i;
const NET = /\bnet(o)?\b/i;

function flowOf(text: string): Flow | undefined {
  if (TO_GRID.test(text)) return "to-grid";
  if (FROM_GRID.test(text)) return "from-grid";
  return NET.test(text) ? "net" : undefined;
}

/**
 * Tier (block) lines of an energy charge: "first 500 kWh", "next 400 kWh", "over 900 kWh". The
 * figure after the tier word is the block's bound, never the period's kWh. A tier's quantity is
 * another kWh figure on its line ("Over 900 kWh: 123 kWh"), else the bound of a "first" / "next"
 * block (the block was filled); null when the line does not say ("over 900 kWh @ $0.14").
 */
const TIER = new RegExp(String.raw`\b(first|next|over|above|up\s+to|in\s+excess\s+of|excess\s+of|additional|remaining|primeros|siguientes|m[aá]s\s+de|exceso\s+de)\s+(${NUMBER})\s*kwh`, "iu");
function tierOf(text: string): { bound: number; quantity: number | null } | null {
  const m = text.match(TIER);
  if (!m) return null;
  const bound = toNumber(m[2]);
  const rest = (text.slice(0, m.index) + " " + text.slice((m.index ?? 0) + m[0].length)).match(new RegExp(String.raw`(?<![\d.,$])(${NUMBER}) ?kwh\b(?!\s*(\/|per\b))`, "i"));
  if (rest) return { bound, quantity: toNumber(rest[1]) };
  return { bound, quantity: /^(first|next|up|primeros|siguientes)/i.test(m[1]) ? bound : null };
}

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
  const flow = flowOf(t);
  const tier = tierOf(t);
  return out.map((c) => ({ ...(tou && !c.tou && !STRONG.test(t.replace(TOU, "")) ? { ...c, tou } : c), flow, tier: !!tier }));
}

/** A meter table: a kWh column header with the figure below it. */
function columnCandidates(lines: Line[]): Candidate[] {
  const out: Candidate[] = [];
  lines.forEach((line, i) => {
    line.cells.forEach((cell) => {
      if (!isKwhHeader(cell.text.trim())) return;
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
          flow: flowOf(lines[k].text),
        });
      }
    });
  });
  return out;
}

export type KwhRead = { kwh: Found<number> | null; warnings: string[] };

const kwhText = (n: number) => n.toLocaleString("en-US");

/** A net-metering bill (figures both from and to the grid): the kWh delivered from the grid, said so. */
function netMetered(all: Candidate[]): KwhRead | null {
  const from = all.filter((c) => c.flow === "from-grid" && c.score > 0).sort((a, b) => b.score - a.score);
  const to = all.find((c) => c.flow === "to-grid");
  if (!from.length || !to) return null;
  const best = from[0];
  const rivals = from.filter((c) => c.score === best.score && c.kwh !== best.kwh);
  const net = all.find((c) => c.flow === "net" && c.kwh !== best.kwh);
  const warnings = [
    `A net-metering bill: this period's kWh is the ${kwhText(best.kwh)} kWh delivered from the grid${net ? `, not the net ${kwhText(net.kwh)} kWh billed` : ""} (${kwhText(to.kwh)} kWh went to the grid).`,
  ];
  if (rivals.length) warnings.push(`More than one kWh figure could be this period's: ${[best, ...rivals].map((c) => kwhText(c.kwh)).join(", ")}. Check the bill.`);
  return { kwh: { value: best.kwh, where: whereOf(best.line), confidence: rivals.length ? "medium" : "high", label: "delivered from the grid" }, warnings };
}

/** The tier lines' quantities summed, when every tier line says its quantity and there are two or more. */
function tierSum(lines: Line[]): { kwh: number; line: Line } | null {
  const tiers = lines.flatMap((line) => {
    const t = tierOf(line.text);
    return t ? [{ ...t, line }] : [];
  });
  if (tiers.length < 2 || tiers.some((t) => t.quantity === null)) return null;
  return { kwh: tiers.reduce((s, t) => s + t.quantity!, 0), line: tiers[0].line };
}

/** The period's kWh, from lines without the usage history. */
export function readKwh(lines: Line[]): KwhRead {
  // A tier line's figures are the blocks of the energy charge, never the period's kWh.
  const all = [...lines.flatMap(lineCandidates), ...columnCandidates(lines)].filter((c) => c.kwh > 0 && c.kwh < 100_000 && !c.tier);
  const net = netMetered(all);
  if (net) return net;
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
  const tiers = tierSum(lines);
  // Only tier lines, or nothing better than a priced line: the tiers' quantities summed.
  if (tiers && (!best || best.score < 2) && best?.kwh !== tiers.kwh) {
    const others = ranked.filter((c) => c.score > 0 && c.kwh !== tiers.kwh).map((c) => kwhText(c.kwh));
    if (others.length) warnings.push(`More than one kWh figure could be this period's: ${[kwhText(tiers.kwh), ...others].join(", ")}. Check the bill.`);
    return { kwh: { value: tiers.kwh, where: whereOf(tiers.line), confidence: "medium", label: "sum of the tier lines" }, warnings };
  }
  if (!best || best.score <= 0) return { kwh: null, warnings };
  // A figure the tier lines add up to is confirmed by them.
  const rivals = ranked.filter((c) => c.score === best.score && c.kwh !== best.kwh && c.kwh !== tiers?.kwh);
  const agreed = tiers?.kwh === best.kwh && best.score < 2;
  const confidence: Confidence = best.score >= 3 && !rivals.length ? "high" : best.score >= 2 || agreed ? "medium" : "low";
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

// The homeowner's page in plain words (issue #18 item 5): the frozen assumption sentences of a
// proposal snapshot lose station ids, file formats and method citations, and say the same in
// words; an APR reads the way the lender quotes it. Applied when a snapshot is made and again
// when a page shows an older one. Pure: no server or browser imports.

/** "GREENSBORO PIEDMONT TRIAD INT, NC" → "Greensboro Piedmont Triad Int, NC": a name in capitals gets title case; a two-letter state and a mixed-case name stay as they are. */
function placeName(raw: string): string {
  return raw
    .trim()
    .split(/,\s*/)
    .map((part) =>
      /^[A-Z]{2}$/.test(part) || part !== part.toUpperCase() ? part : part.toLowerCase().replace(/(^|[\s\-/])([a-z])/g, (_m, sep: string, c: string) => sep + c.toUpperCase()),
    )
    .join(", ");
}

/** Where a weather source label ("TMY3 723170 GREENSBORO …", "EPW Name (source)") says the weather was measured, without ids or formats. */
export function weatherSourcePlace(label: string): { typed: string } | { place: string } | null {
  const typed = label.match(/^Typed from another source: (.*)$/);
  if (typed) return { typed: typed[1] };
  const station = label
    .replace(/\s*\([^)]*\)/g, "")
    .replace(/^(NREL\s+)?(TMY3|TMY|EPW)(\s+station)?\s*/i, "")
    .replace(/^\d{5,6}\s*/, "")
    .trim();
  return station ? { place: placeName(station) } : null;
}

/** A weather source label as the office stores it → where it was measured, in words. */
export function plainWeatherSource(label: string): string {
  const w = weatherSourcePlace(label);
  if (w && "typed" in w) return `hourly weather typed in from ${w.typed}`;
  return w ? `a typical year of hourly sun and temperature measured at ${w.place}` : "a typical year of hourly sun and temperature measured near your home";
}

const REWRITES: [RegExp, string][] = [
  // Method citations belong to the office; the words around them stay.
  [/;\s*PVWatts method, Dobos 2014\)/g, ")"],
  [/\s*\(?PVWatts(?: v5)?(?: method)?,? Dobos 2014\)?/g, ""],
  [/ from a degree-day regression against the site's weather \(PRISM method, Fels 1986\)/g, " from how your usage follows the weather at your home"],
  // One spelling: US English.
  [/\bprogramme(s?)\b/g, "program$1"],
  [/\bProgramme(s?)\b/g, "Program$1"],
  [/\blicence\b/g, "license"],
  [/\bLicence\b/g, "License"],
];

/** One assumption sentence in the homeowner's words. */
export function plainAssumption(sentence: string): string {
  const weather = sentence.match(/^Weather: (.*?)\.?$/);
  if (weather) return `Weather: ${plainWeatherSource(weather[1])}.`;
  return REWRITES.reduce((s, [from, to]) => s.replace(from, to), sentence);
}

/** An APR as lenders quote it: to the hundredth, trailing zeros dropped ("6.99 %", "7 %"). */
export function formatAprPct(aprPct: number): string {
  return `${aprPct.toLocaleString("en-US", { maximumFractionDigits: 2, useGrouping: false })} %`;
}

/**
 * Every assumption sentence in plain words; a loan's sentence states the offer's own APR (older
 * snapshots rounded it to one decimal, so "6.99 %" beside "7.0 %").
 */
export function plainAssumptions(sentences: readonly string[], offers: readonly { name: string; inputs: { payment: { kind: string; aprPct?: number } } }[]): string[] {
  return sentences.map((raw) => {
    const s = plainAssumption(raw);
    const loan = offers.find((o) => o.inputs.payment.kind === "loan" && o.inputs.payment.aprPct !== undefined && s.startsWith(`"${o.name}" is paid with a loan: `));
    return loan ? s.replace(/: [\d.]+ % APR/, `: ${formatAprPct(loan.inputs.payment.aprPct ?? 0)} APR`) : s;
  });
}

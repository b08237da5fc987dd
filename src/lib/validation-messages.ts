// Validation messages a person can read. zod's issues become plain words naming the field
// ("Latitude is required", "Period 2 — cents per kWh must be at least 0"), never a dotted path
// or zod's own wording ("expected number, received NaN"). Without a form's labels a field is
// named from its path; a form passes its labels (`FieldLabels`) and the same message then
// names the field as the form shows it ("Period 2 — Price (¢/kWh) must be at least 0").
// Importing this module installs the plain words as zod's error map (z.config customError):
// the server's route wrapper and the forms' useSave import it, so both sides speak alike.
import { z } from "zod";

/**
 * A form's labels by dotted path; `#` stands for any list position, and `{n}` in a label for
 * that position counted from 1: `{ "energy.periods.#": "Period {n}", "energy.periods.#.centsPerKwh": "Price (¢/kWh)" }`.
 * The labels of the list entries on the way to the field are joined with its own by " — ".
 */
export type FieldLabels = Readonly<Record<string, string>>;

type Issue = z.core.$ZodRawIssue;
type Path = string | readonly PropertyKey[];

const isIndex = (part: string) => /^\d+$/.test(part);
const partsOf = (path: Path) => (typeof path === "string" ? path.split(".").filter(Boolean) : path.map(String));
const capitalise = (s: string) => (s ? s[0].toUpperCase() + s.slice(1) : s);

// Units and abbreviations keep their spelling when a path is turned into words (our choice).
const WORDS: Record<string, string> = { kwh: "kWh", kw: "kW", dc: "DC", ac: "AC", zip: "ZIP", id: "ID", ids: "IDs", pto: "PTO", ahj: "AHJ", url: "URL", pct: "%", stc: "STC", voc: "Voc", isc: "Isc", vmp: "Vmp", imp: "Imp", mm: "mm" };

/** "centsPerKwh" → "cents per kWh", "on_hold" → "on hold". */
function words(name: string): string {
  return name
    .replace(/([a-z0-9])([A-Z])/g, "$1 $2")
    .replaceAll("_", " ")
    .split(" ")
    .map((w) => WORDS[w.toLowerCase()] ?? w.toLowerCase())
    .join(" ");
}

/** A list's name for one of its entries: "periods" → "period", "lineItems" → "line item". */
const singular = (name: string) => words(name).replace(/(ies)$/, "y").replace(/([^s])s$/, "$1");

/** The field's name from its path alone: each list entry by its number, then the field. */
function pathWords(parts: string[]): string {
  const named: string[] = [];
  parts.forEach((part, i) => {
    const next = parts[i + 1];
    if (isIndex(part)) return;
    if (next !== undefined && isIndex(next)) named.push(`${singular(part)} ${Number(next) + 1}`);
    else if (i === parts.length - 1) named.push(words(part));
  });
  return capitalise(named.join(" — "));
}

/** The field as a person knows it: the form's labels where it has them, else its path in words. */
export function labelOf(path: Path, labels?: FieldLabels): string {
  const parts = partsOf(path);
  if (!labels) return pathWords(parts);
  const named: string[] = [];
  let leafNamed = false;
  for (let i = 1; i <= parts.length; i++) {
    const prefix = parts.slice(0, i);
    // Above the field itself only list entries are named ("Period 2 — …"): a group's or a
    // list's own label names only its own problems ("Seasons: month 1 is in no season").
    if (i < parts.length && !isIndex(parts[i - 1])) continue;
    const label = labels[prefix.map((p) => (isIndex(p) ? "#" : p)).join(".")];
    if (label === undefined) continue;
    const position = prefix.findLast(isIndex);
    named.push(position === undefined ? label : label.replaceAll("{n}", String(Number(position) + 1)));
    leafNamed = i === parts.length;
  }
  if (named.length === 0) return pathWords(parts);
  if (!leafNamed && !isIndex(parts[parts.length - 1])) named.push(words(parts[parts.length - 1]));
  return named.join(" — ");
}

const numberText = (n: number | bigint) => (typeof n === "bigint" ? n.toString() : n.toLocaleString("en-US", { maximumFractionDigits: 6 }));
const entries = (n: number | bigint) => (Number(n) === 1 ? "one entry" : `${numberText(n)} entries`);
const isEmpty = (input: unknown) => input === undefined || input === null || input === "" || (typeof input === "number" && Number.isNaN(input));

const TYPE_WORDS: Record<string, string> = { number: "a number", int: "a whole number", string: "text", boolean: "yes or no", array: "a list", object: "a group of fields", date: "a date" };

function tooSmall(iss: Extract<Issue, { code: "too_small" }>): string {
  const { origin, minimum, inclusive } = iss;
  if (origin === "string") return Number(minimum) <= 1 ? "is required" : `must be at least ${numberText(minimum)} characters`;
  if (origin === "array" || origin === "set") return Number(minimum) <= 1 ? "needs at least one entry" : `needs at least ${entries(minimum)}`;
  if (origin === "date") return `must be on or after ${String(minimum)}`;
  return inclusive === false ? `must be more than ${numberText(minimum)}` : `must be at least ${numberText(minimum)}`;
}

function tooBig(iss: Extract<Issue, { code: "too_big" }>): string {
  const { origin, maximum, inclusive } = iss;
  if (origin === "string") return `must be at most ${numberText(maximum)} characters`;
  if (origin === "array" || origin === "set") return `takes at most ${entries(maximum)}`;
  if (origin === "date") return `must be on or before ${String(maximum)}`;
  return inclusive === false ? `must be less than ${numberText(maximum)}` : `must be at most ${numberText(maximum)}`;
}

const FORMAT_WORDS: Record<string, string> = { email: "must be an e-mail address, like name@example.com", url: "must be a web address", uuid: "must be picked from the list", date: "must be a date like 2026-04-30", datetime: "must be a date and time" };

/** What is wrong, as the end of a sentence whose subject is the field: "is required", "must be at least 0". */
export function plainPredicate(iss: Issue): string {
  switch (iss.code) {
    case "invalid_type":
      return isEmpty(iss.input) ? "is required" : `must be ${TYPE_WORDS[iss.expected] ?? iss.expected}`;
    case "too_small":
      return tooSmall(iss);
    case "too_big":
      return tooBig(iss);
    case "invalid_format":
      return FORMAT_WORDS[iss.format] ?? "is not in the expected form";
    case "not_multiple_of":
      return iss.divisor === 1 ? "must be a whole number" : `must be a multiple of ${numberText(iss.divisor)}`;
    case "invalid_value":
      return isEmpty(iss.input) ? "is required" : iss.values.length <= 6 ? `must be one of: ${iss.values.map(String).join(", ")}` : "must be one of the choices";
    case "unrecognized_keys":
      return `has fields this form does not take: ${iss.keys.join(", ")}`;
    default:
      return isEmpty(iss.input) ? "is required" : "is not valid";
  }
}

/** A sentence naming the field: "Label is required", or "Label: Enter a name" for a message of its own. */
export function withLabel(label: string, message: string): string {
  if (!label) return capitalise(message);
  return /^(is|are|must|needs|takes|has|cannot) /.test(message) ? `${capitalise(label)} ${message}` : `${label}: ${message}`;
}

/** zod's error map: every issue without a message of its own, in words naming the field. */
export const plainError = (labels?: FieldLabels) => (iss: Issue) => {
  const path = iss.path ?? [];
  return path.length ? withLabel(labelOf(path, labels), plainPredicate(iss)) : capitalise(`the input ${plainPredicate(iss)}`);
};

z.config({ customError: plainError() });

/**
 * A message made without the form's labels (by the server, or by zod's map here) named again
 * with them: "Period 2 — cents per kWh must be …" → "Period 2 — Price (¢/kWh) must be …". A
 * schema's own message ("Enter a ZIP code like 27401") stays as it is.
 */
export function relabel(path: Path, message: string, labels?: FieldLabels): string {
  if (!labels) return message;
  const plain = labelOf(path);
  return plain && message.startsWith(`${plain} `) ? `${capitalise(labelOf(path, labels))}${message.slice(plain.length)}` : message;
}

/** The message in a list of problems or a status line: it names the field whatever it says. */
export function namedMessage(path: Path, message: string, labels?: FieldLabels): string {
  const parts = partsOf(path);
  if (parts.length === 0 || (parts.length === 1 && parts[0] === "_")) return message;
  const text = relabel(parts, message, labels);
  const label = labelOf(parts, labels);
  return text.startsWith(capitalise(label)) || text.startsWith(labelOf(parts)) ? text : withLabel(label, text);
}

/** Each field's messages named again with the form's labels. */
export function relabelFields(fields: Record<string, string[]>, labels?: FieldLabels): Record<string, string[]> {
  return Object.fromEntries(Object.entries(fields).map(([path, messages]) => [path, messages.map((m) => relabel(path, m, labels))]));
}

/** The status line after a refused save: the first problem by its label, and how many more. */
export function notSavedMessage(problems: [path: string, message: string][], labels?: FieldLabels): string {
  const [first, ...rest] = problems;
  if (!first) return "Not saved.";
  const more = rest.length === 0 ? "" : ` ${rest.length} more ${rest.length === 1 ? "field needs" : "fields need"} attention, marked on the form.`;
  return `Not saved: ${namedMessage(first[0], first[1], labels)}.${more}`.replace(/\.\.(?= |$)/, ".");
}

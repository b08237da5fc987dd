// Form-encoded parameters as the Stripe SDK sends them (bodies of POSTs, query strings of
// GETs): `a=1&b[c]=2&items[0][name]=x&expand[]=y`, brackets either literal or %5B/%5D.
// Objects whose keys are all array indices become arrays, like the API reads them.

export type ParamValue = string | ParamObject | ParamValue[];
export interface ParamObject {
  [key: string]: ParamValue;
}

/** Thrown for a body the API would refuse before reading any parameter. */
export class FormError extends Error {}

const FORBIDDEN_KEYS = new Set(["__proto__", "constructor", "prototype"]);
const MAX_DEPTH = 8;
const MAX_PAIRS = 5000;

function decode(part: string): string {
  try {
    return decodeURIComponent(part.replace(/\+/g, " "));
  } catch {
    throw new FormError(`Invalid percent-encoding in \`${part.slice(0, 60)}\`.`);
  }
}

/** `a[b][0][c]` → ["a", "b", "0", "c"]; `expand[]` → ["expand", ""]. */
function splitKey(key: string): string[] {
  const open = key.indexOf("[");
  if (open <= 0) return [key];
  const path = [key.slice(0, open)];
  let rest = key.slice(open);
  while (rest.length > 0) {
    const m = /^\[([^\][]*)\]/.exec(rest);
    if (!m) throw new FormError(`Invalid parameter name \`${key}\`.`);
    path.push(m[1]);
    rest = rest.slice(m[0].length);
  }
  return path;
}

type Node = { [key: string]: Node | string };

function isNode(v: Node | string | undefined): v is Node {
  return typeof v === "object" && v !== null;
}

/** Parses `application/x-www-form-urlencoded` text into nested params. */
export function parseForm(text: string): ParamObject {
  const root: Node = Object.create(null) as Node;
  if (text.trim() === "") return {};
  const pairs = text.split("&").filter((p) => p.length > 0);
  if (pairs.length > MAX_PAIRS) throw new FormError(`Too many parameters (more than ${MAX_PAIRS}).`);
  const pushCounters = new Map<Node, number>();
  for (const pair of pairs) {
    const eq = pair.indexOf("=");
    const key = decode(eq < 0 ? pair : pair.slice(0, eq));
    const value = eq < 0 ? "" : decode(pair.slice(eq + 1));
    const path = splitKey(key);
    if (path.length > MAX_DEPTH) throw new FormError(`Parameter \`${key}\` is nested too deeply.`);
    let node = root;
    for (let i = 0; i < path.length; i++) {
      let part = path[i];
      if (FORBIDDEN_KEYS.has(part)) throw new FormError(`Invalid parameter name \`${key}\`.`);
      if (part === "") {
        // `list[]=a&list[]=b`: append.
        const next = pushCounters.get(node) ?? Object.keys(node).length;
        pushCounters.set(node, next + 1);
        part = String(next);
      }
      const last = i === path.length - 1;
      if (last) {
        if (isNode(node[part])) throw new FormError(`Parameter \`${key}\` is given both as a value and as an object.`);
        node[part] = value;
      } else {
        const existing = node[part];
        if (existing === undefined) {
          const child = Object.create(null) as Node;
          node[part] = child;
          node = child;
        } else if (isNode(existing)) {
          node = existing;
        } else {
          throw new FormError(`Parameter \`${key}\` is given both as a value and as an object.`);
        }
      }
    }
  }
  return normalise(root) as ParamObject;
}

/** Plain objects (no null prototype) with index-keyed objects turned into arrays. */
function normalise(node: Node | string): ParamValue {
  if (typeof node === "string") return node;
  const keys = Object.keys(node);
  if (keys.length > 0 && keys.every((k) => /^(0|[1-9]\d{0,3})$/.test(k))) {
    return keys
      .map(Number)
      .sort((a, b) => a - b)
      .map((k) => normalise(node[String(k)]));
  }
  const out: ParamObject = {};
  for (const k of keys) out[k] = normalise(node[k]);
  return out;
}

/** Stable text of params for comparing two requests (idempotency). */
export function canonicalParams(value: ParamValue | undefined): string {
  if (value === undefined) return "null";
  if (typeof value === "string") return JSON.stringify(value);
  if (Array.isArray(value)) return `[${value.map(canonicalParams).join(",")}]`;
  const keys = Object.keys(value).sort();
  return `{${keys.map((k) => `${JSON.stringify(k)}:${canonicalParams(value[k])}`).join(",")}}`;
}

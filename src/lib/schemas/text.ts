// Text a person types (names and short texts), checked the same way in the form and on the
// server, and the one place a form turns a typed number into a number before its schema sees it.
import { z } from "zod";

const describe = (c: string) => `U+${c.codePointAt(0)!.toString(16).toUpperCase().padStart(4, "0")}`;

/**
 * What is wrong with a text, or null when it is plain: control characters (C0 and C1; a
 * multi-line text may keep tab and line breaks), unpaired surrogates (not a character at all)
 * and the bidirectional embeddings, overrides and isolates U+202A–U+202E and U+2066–U+2069,
 * which make text display in another order than it is stored (Unicode TR #9; the "Trojan
 * Source" attack, CVE-2021-42574). Marks inside right-to-left names (U+200E/U+200F) stay allowed.
 */
export function textProblem(value: string, opts: { multiline?: boolean } = {}): string | null {
  for (let i = 0; i < value.length; i++) {
    const code = value.charCodeAt(i);
    if (code >= 0xd800 && code <= 0xdbff) {
      const next = value.charCodeAt(i + 1);
      if (next >= 0xdc00 && next <= 0xdfff) {
        i++;
        continue;
      }
      return "contains a broken character (an unpaired surrogate); type it again";
    }
    if (code >= 0xdc00 && code <= 0xdfff) return "contains a broken character (an unpaired surrogate); type it again";
    const ch = value[i];
    if (opts.multiline && (ch === "\n" || ch === "\r" || ch === "\t")) continue;
    if (code < 0x20 || (code >= 0x7f && code <= 0x9f)) return `contains a control character (${describe(ch)}); remove it`;
    if ((code >= 0x202a && code <= 0x202e) || (code >= 0x2066 && code <= 0x2069)) {
      return `contains a text-direction character (${describe(ch)}) that makes it display differently than it is stored; remove it`;
    }
  }
  return null;
}

/**
 * A string that refuses hidden characters (textProblem): use it for every name and short text
 * a person types, in place of z.string(). Single-line unless `multiline` (notes, questions).
 */
export function plainText(params: { multiline?: boolean; error?: string } = {}) {
  return z.string(params.error ? { error: params.error } : undefined).superRefine((value, ctx) => {
    const problem = textProblem(value, { multiline: params.multiline });
    if (problem) ctx.addIssue({ code: "custom", message: `This text ${problem}` });
  });
}

/**
 * For a form's number field (react-hook-form `setValueAs`): the typed text as a number, "" as
 * NaN (so the schema says "enter …"), a number as it is. The schema stays strict (z.number()):
 * the server never turns null, true, [] or "" into 0.
 */
export function numberFromField(value: unknown): unknown {
  if (typeof value !== "string") return value;
  const t = value.trim().replaceAll(",", "");
  return t === "" ? Number.NaN : Number(t);
}

// The homeowner's catalogs (issue #18 item 6): Spanish has exactly English's keys, no message is
// empty, and every message takes the same placeholders and tags in both languages (parsed as ICU
// messages, the syntax next-intl formats), so a missing or misspelt key or argument fails here.
import { parse, TYPE, type MessageFormatElement } from "@formatjs/icu-messageformat-parser";
import { describe, expect, it } from "vitest";
import { LOCALES } from "./locales";
import { CATALOGS } from "./translator";

type Tree = { [key: string]: string | Tree };

function flatten(tree: Tree, prefix = ""): Map<string, string> {
  const out = new Map<string, string>();
  for (const [k, v] of Object.entries(tree)) {
    const key = prefix ? `${prefix}.${k}` : k;
    if (typeof v === "string") out.set(key, v);
    else for (const [kk, vv] of flatten(v, key)) out.set(kk, vv);
  }
  return out;
}

/** "arg:name", "plural:count", "tag:b", … of a message, sorted. */
function signature(message: string): string[] {
  const found = new Set<string>();
  const walk = (els: MessageFormatElement[]) => {
    for (const el of els) {
      if (el.type === TYPE.argument) found.add(`arg:${el.value}`);
      else if (el.type === TYPE.number || el.type === TYPE.date || el.type === TYPE.time) found.add(`${TYPE[el.type]}:${el.value}`);
      else if (el.type === TYPE.plural || el.type === TYPE.select) {
        found.add(`${TYPE[el.type]}:${el.value}`);
        for (const option of Object.values(el.options)) walk(option.value);
      } else if (el.type === TYPE.tag) {
        found.add(`tag:${el.value}`);
        walk(el.children);
      }
    }
  };
  walk(parse(message));
  return [...found].sort();
}

const en = flatten(CATALOGS.en as unknown as Tree);

describe("message catalogs", () => {
  it("has messages", () => {
    expect(en.size).toBeGreaterThan(100);
  });

  for (const locale of LOCALES.filter((l) => l !== "en")) {
    const other = flatten(CATALOGS[locale] as unknown as Tree);

    it(`${locale} has every key of en and no other`, () => {
      expect([...en.keys()].filter((k) => !other.has(k))).toEqual([]);
      expect([...other.keys()].filter((k) => !en.has(k))).toEqual([]);
    });

    it(`${locale} takes the same placeholders and tags as en in every message`, () => {
      const differ = [...en].filter(([k, v]) => other.has(k) && signature(v).join(" ") !== signature(other.get(k)!).join(" ")).map(([k]) => k);
      expect(differ).toEqual([]);
    });
  }

  for (const locale of LOCALES) {
    it(`${locale} has no empty message and every message parses`, () => {
      const messages = flatten(CATALOGS[locale] as unknown as Tree);
      expect([...messages].filter(([, v]) => v.trim() === "").map(([k]) => k)).toEqual([]);
      for (const [k, v] of messages) expect(() => parse(v), k).not.toThrow();
    });
  }
});

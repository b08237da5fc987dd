import { describe, expect, it } from "vitest";
import { longFunctions } from "./check-function-length";

const body = (n: number) => Array.from({ length: n }, (_, i) => `  const v${i} = ${i};`).join("\n");

describe("check-function-length", () => {
  it("flags a long function, a long arrow and a long component by name, with their lengths", () => {
    const text = [
      `export function tall() {\n${body(85)}\n}`,
      `const arrow = async () => {\n${body(90)}\n};`,
      `export default function Page() {\n${body(81)}\n  return <div />;\n}`,
      `function short() {\n${body(10)}\n}`,
    ].join("\n\n");
    const found = longFunctions("src/x.tsx", text);
    expect(found.map((f) => [f.name, f.lines])).toEqual([
      ["tall", 87],
      ["arrow", 92],
      ["Page", 84],
    ]);
  });

  it("accepts a long function with its reason written right above it", () => {
    const text = `// long because: one published procedure, step for step\nexport function tall() {\n${body(85)}\n}\n\n/** Docs. */\n// long because: a table of cases\nconst arrow = () => {\n${body(85)}\n};`;
    expect(longFunctions("src/x.ts", text)).toEqual([]);
  });

  it("does not take an unrelated comment, or a reason with nothing after it, for a reason", () => {
    const text = `// the tall one\nexport function tall() {\n${body(85)}\n}\n\n// long because:\nfunction bare() {\n${body(85)}\n}`;
    expect(longFunctions("src/x.ts", text).map((f) => f.name)).toEqual(["tall", "bare"]);
  });
});

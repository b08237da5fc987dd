// Import cycles and layer breaks in src: resolves every import with TypeScript's own module
// resolution (the tsconfig's paths), then reports strongly connected groups of files (Tarjan),
// imports against the layer picture in DEVELOPERS.md (LAYERS below), and a feature folder of
// src/app importing another one (shared parts go to src/components/ui, shared schemas to
// src/lib/schemas). Type-only imports count too: a cycle of types is still a knot for a reader.
// Usage: npx tsx scripts/check-import-cycles.ts
import path from "node:path";
import { fileURLToPath } from "node:url";
import ts from "typescript";

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");
const configPath = ts.findConfigFile(root, ts.sys.fileExists, "tsconfig.json")!;
const config = ts.parseJsonConfigFileContent(ts.readConfigFile(configPath, ts.sys.readFile).config, ts.sys, root);
const files = config.fileNames.filter((f) => f.startsWith(path.join(root, "src") + path.sep));
const known = new Set(files);

const edges = new Map<string, string[]>();
for (const file of files) {
  const info = ts.preProcessFile(ts.sys.readFile(file)!, true, true);
  const out: string[] = [];
  for (const ref of info.importedFiles) {
    const resolved = ts.resolveModuleName(ref.fileName, file, config.options, ts.sys).resolvedModule;
    if (resolved && known.has(resolved.resolvedFileName)) out.push(resolved.resolvedFileName);
  }
  edges.set(file, out);
}

// Tarjan's strongly connected components
let index = 0;
const idx = new Map<string, number>();
const low = new Map<string, number>();
const stack: string[] = [];
const onStack = new Set<string>();
const groups: string[][] = [];
function connect(v: string) {
  idx.set(v, index);
  low.set(v, index++);
  stack.push(v);
  onStack.add(v);
  for (const w of edges.get(v) ?? []) {
    if (!idx.has(w)) {
      connect(w);
      low.set(v, Math.min(low.get(v)!, low.get(w)!));
    } else if (onStack.has(w)) low.set(v, Math.min(low.get(v)!, idx.get(w)!));
  }
  if (low.get(v) === idx.get(v)) {
    const group: string[] = [];
    let w: string;
    do {
      w = stack.pop()!;
      onStack.delete(w);
      group.push(w);
    } while (w !== v);
    if (group.length > 1 || (edges.get(v) ?? []).includes(v)) groups.push(group);
  }
}
for (const f of files) if (!idx.has(f)) connect(f);

const rel = (f: string) => path.relative(root, f);
/** What each layer must never import (the picture in DEVELOPERS.md). */
const LAYERS: [from: string, never: string[]][] = [
  ["src/engine/", ["src/app/", "src/components/", "src/server/", "src/db/", "src/lib/", "src/documents/"]],
  ["src/lib/", ["src/app/", "src/components/", "src/server/"]],
  ["src/documents/", ["src/app/", "src/components/", "src/server/"]],
  ["src/server/", ["src/app/", "src/components/"]],
  ["src/components/", ["src/app/", "src/server/"]],
];
const layerBreaks = files.flatMap((f) => {
  const rule = LAYERS.find(([from]) => rel(f).startsWith(from));
  if (!rule) return [];
  return (edges.get(f) ?? []).filter((t) => rule[1].some((p) => rel(t).startsWith(p))).map((t) => `${rel(f)} -> ${rel(t)}`);
});

/**
 * The feature folder of a file in src/app: "api", "p", "verify" or, inside a route group,
 * "(office)/catalog". Files at the top of a group (its layout, providers, parts its screens
 * share, e.g. the auth forms' frame) are its shell: a shell may import its features and a
 * feature its own group's shell, a feature never another feature nor another group.
 */
function feature(f: string): string | null {
  const parts = rel(f).split("/").slice(2); // after src/app
  if (parts.length < 2) return null; // src/app/layout.tsx and friends
  if (parts[0].startsWith("(")) return parts.length > 2 ? `${parts[0]}/${parts[1]}` : `${parts[0]} shell`;
  return parts[0];
}
const featureBreaks = files.flatMap((f) => {
  const from = rel(f).startsWith("src/app/") ? feature(f) : null;
  if (!from || from.endsWith(" shell")) return [];
  return (edges.get(f) ?? [])
    .filter((t) => rel(t).startsWith("src/app/") && feature(t) !== null && feature(t) !== from && feature(t) !== `${from.split("/")[0]} shell`)
    .map((t) => `${rel(f)} -> ${rel(t)}`);
});

for (const g of groups) console.log(`cycle (${g.length} files):\n  ${g.map(rel).sort().join("\n  ")}`);
for (const b of layerBreaks) console.log(`layer break: ${b}`);
for (const b of featureBreaks) console.log(`feature folders import each other: ${b}`);
console.log(`${files.length} files, ${groups.length} cycle(s), ${layerBreaks.length} layer break(s), ${featureBreaks.length} feature-to-feature import(s)`);
process.exit(groups.length || layerBreaks.length || featureBreaks.length ? 1 : 0);

// Import cycles and layer breaks in src: resolves every import with TypeScript's own module
// resolution (the tsconfig's paths), then reports strongly connected groups of files (Tarjan)
// and any src/documents file that imports src/server. Type-only imports count too: a cycle of
// types is still a knot for a reader. Usage: npx tsx scripts/check-import-cycles.ts
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
const layerBreaks = files.flatMap((f) =>
  rel(f).startsWith("src/documents/") ? (edges.get(f) ?? []).filter((t) => rel(t).startsWith("src/server/")).map((t) => `${rel(f)} -> ${rel(t)}`) : [],
);
for (const g of groups) console.log(`cycle (${g.length} files):\n  ${g.map(rel).sort().join("\n  ")}`);
for (const b of layerBreaks) console.log(`documents imports server: ${b}`);
console.log(`${files.length} files, ${groups.length} cycle(s), ${layerBreaks.length} documents->server import(s)`);
process.exit(groups.length || layerBreaks.length ? 1 : 0);

// The browser gets no database schema (issue #14, item 12): after `next build`, no client chunk may
// contain drizzle. drizzle-orm tags every class with `Symbol.for("drizzle:entityKind")` and names its
// columns and tables with `Symbol.for("drizzle:Name")`; those strings survive minification, so
// finding one in `.next/static/chunks` means a client component imports a file that imports drizzle.
import { existsSync, readdirSync, readFileSync } from "node:fs";
import path from "node:path";

const MARKERS = ["drizzle:entityKind", "drizzle:Name", "drizzle:Columns"];

function jsFiles(dir: string): string[] {
  const out: string[] = [];
  for (const entry of readdirSync(dir, { withFileTypes: true })) {
    const p = path.join(dir, entry.name);
    if (entry.isDirectory()) out.push(...jsFiles(p));
    else if (entry.name.endsWith(".js")) out.push(p);
  }
  return out;
}

/** Client chunks (relative to .next/static/chunks) that contain a drizzle marker, with the marker found. */
export function clientChunksWithDrizzle(projectRoot: string): { chunk: string; marker: string }[] {
  const chunks = path.join(projectRoot, ".next", "static", "chunks");
  if (!existsSync(chunks)) throw new Error(`${chunks} does not exist: run \`next build\` first.`);
  const found: { chunk: string; marker: string }[] = [];
  for (const file of jsFiles(chunks)) {
    const text = readFileSync(file, "utf8");
    const marker = MARKERS.find((m) => text.includes(m));
    if (marker) found.push({ chunk: path.relative(chunks, file), marker });
  }
  return found;
}

/** Prints the verdict; true when no client chunk contains drizzle. */
export function checkClientBundles(projectRoot: string): boolean {
  const found = clientChunksWithDrizzle(projectRoot);
  if (found.length === 0) {
    console.log("✓ no client chunk contains drizzle");
    return true;
  }
  console.error(`✗ ${found.length} client chunk(s) contain drizzle (a client component imports a file that imports drizzle-orm, e.g. @/db/schema):`);
  for (const f of found) console.error(`  .next/static/chunks/${f.chunk}  (found "${f.marker}")`);
  return false;
}

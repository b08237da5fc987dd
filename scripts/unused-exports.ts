/**
 * npx tsx scripts/unused-exports.ts — exports under src/ and emails/ that no other file uses,
 * found with the TypeScript compiler's own reference search (the project's tsconfig, so path
 * aliases and re-exports count). Prints two lists:
 *   unused   — referenced nowhere but their declaration: dead code;
 *   local    — used only inside their own file: the `export` can go;
 *   tests    — used only by tests (kept: tests' helpers and seams).
 * Next.js reads some exports by name (page/layout `default`, route `GET`…, `metadata`, the proxy's
 * `config`); those are never listed. Exit code 1 when the unused list is not empty.
 */
import path from "node:path";
import ts from "typescript";

const root = path.resolve(import.meta.dirname, "..");
const configPath = ts.findConfigFile(root, ts.sys.fileExists, "tsconfig.json");
if (!configPath) throw new Error("tsconfig.json not found");
const parsed = ts.parseJsonConfigFileContent(ts.readConfigFile(configPath, ts.sys.readFile).config, ts.sys, root);
const files = parsed.fileNames.filter((f) => !f.includes("/.next/"));

const host: ts.LanguageServiceHost = {
  getCompilationSettings: () => parsed.options,
  getScriptFileNames: () => files,
  getScriptVersion: () => "1",
  getScriptSnapshot: (f) => (ts.sys.fileExists(f) ? ts.ScriptSnapshot.fromString(ts.sys.readFile(f) ?? "") : undefined),
  getCurrentDirectory: () => root,
  getDefaultLibFileName: ts.getDefaultLibFilePath,
  fileExists: ts.sys.fileExists,
  readFile: ts.sys.readFile,
};
const service = ts.createLanguageService(host);
const program = service.getProgram();
if (!program) throw new Error("no program");

// Names Next.js and our runtime read from module exports.
const FRAMEWORK_NAMES = new Set([
  "default", "GET", "POST", "PUT", "PATCH", "DELETE", "HEAD", "OPTIONS", "metadata", "generateMetadata",
  "generateStaticParams", "viewport", "dynamic", "revalidate", "runtime", "preferredRegion", "maxDuration",
  "config", "proxy", "register", "onRequestError",
]);
const isTest = (f: string) => /\.test\.tsx?$|\.spec\.tsx?$|^tests\//.test(f);
const rel = (f: string) => path.relative(root, f);

type Row = { file: string; line: number; name: string };
const unused: Row[] = [];
const local: Row[] = [];
const testsOnly: Row[] = [];

for (const sf of program.getSourceFiles()) {
  const file = rel(sf.fileName);
  if (!/^(src|emails)\//.test(file) || isTest(file)) continue;
  const checker = program.getTypeChecker();
  const moduleSymbol = checker.getSymbolAtLocation(sf);
  if (!moduleSymbol) continue;
  for (const sym of checker.getExportsOfModule(moduleSymbol)) {
    const name = sym.getName();
    if (FRAMEWORK_NAMES.has(name)) continue;
    const decl = sym.declarations?.[0];
    if (!decl || decl.getSourceFile() !== sf) continue; // re-exported from elsewhere
    const nameNode = (decl as ts.NamedDeclaration).name ?? decl;
    const refs = service.findReferences(sf.fileName, nameNode.getStart()) ?? [];
    const uses = refs.flatMap((r) => r.references).filter((r) => !r.isDefinition);
    const line = sf.getLineAndCharacterOfPosition(nameNode.getStart()).line + 1;
    const row = { file, line, name };
    const outside = uses.filter((u) => rel(u.fileName) !== file);
    if (uses.length === 0) unused.push(row);
    else if (outside.length === 0) local.push(row);
    else if (outside.every((u) => isTest(rel(u.fileName)))) testsOnly.push(row);
  }
}

const print = (title: string, rows: Row[]) => {
  console.log(`${title} (${rows.length})`);
  for (const r of rows) console.log(`  ${r.file}:${r.line}  ${r.name}`);
};
print("unused", unused);
print("local", local);
print("tests", testsOnly);
process.exitCode = unused.length > 0 ? 1 : 0;

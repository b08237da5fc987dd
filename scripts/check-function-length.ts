// Functions over ~80 lines in app code (src), React components included, unless a comment right
// above says why ("// long because: …"). The rule is ours: a function that long usually mixes
// concerns. Counted with TypeScript's own parser: function declarations, methods, function
// expressions and arrow functions, each from its first line to its last (nested functions are
// counted on their own too). Usage: npx tsx scripts/check-function-length.ts [files…]
import path from "node:path";
import { fileURLToPath } from "node:url";
import ts from "typescript";

export const MAX_FUNCTION_LINES = 80;
const REASON = /\/\/\s*long because:\s*\S|\/\*+[\s*]*long because:\s*\S/i;

export type LongFunction = { file: string; name: string; line: number; lines: number };

/**
 * Known long functions, each still to be split: in files the UI branches own, and the parsers,
 * engine steps and fakes the libs branch did not get to. Entries are "file (from the project
 * root) + function name"; a listed function that is no longer long fails the check, so the
 * list only shrinks.
 */
export const ALLOWED: { file: string; name: string; reason: string }[] = [];

function nameOf(node: ts.Node): string {
  if ((ts.isFunctionDeclaration(node) || ts.isMethodDeclaration(node) || ts.isFunctionExpression(node)) && node.name) return node.name.getText();
  let p: ts.Node | undefined = node.parent;
  // An arrow or function expression takes the name it is given: const x = …, x: …, export default …
  while (p && (ts.isParenthesizedExpression(p) || ts.isCallExpression(p) || ts.isAsExpression(p) || ts.isSatisfiesExpression(p))) p = p.parent;
  if (p && (ts.isVariableDeclaration(p) || ts.isPropertyAssignment(p) || ts.isPropertyDeclaration(p)) && p.name) return p.name.getText();
  if (p && ts.isExportAssignment(p)) return "default";
  return "(anonymous)";
}

/** The statement whose leading comments speak for the function: its declaration, or the one holding it. */
function commentHolder(node: ts.Node): ts.Node {
  let n: ts.Node = node;
  while (n.parent && !ts.isSourceFile(n.parent) && !ts.isBlock(n.parent) && !ts.isClassLike(n.parent) && !ts.isObjectLiteralExpression(n.parent) && !ts.isModuleBlock(n.parent)) n = n.parent;
  return n;
}

function hasReason(node: ts.Node, source: ts.SourceFile): boolean {
  const text = source.getFullText();
  const holder = commentHolder(node);
  const ranges = [...(ts.getLeadingCommentRanges(text, holder.getFullStart()) ?? []), ...(holder !== node ? (ts.getLeadingCommentRanges(text, node.getFullStart()) ?? []) : [])];
  return ranges.some((r) => REASON.test(text.slice(r.pos, r.end)));
}

/** The functions of one file's text longer than the limit and without a reason beside them. */
export function longFunctions(fileName: string, text: string, max = MAX_FUNCTION_LINES): LongFunction[] {
  const source = ts.createSourceFile(fileName, text, ts.ScriptTarget.Latest, true, fileName.endsWith("x") ? ts.ScriptKind.TSX : ts.ScriptKind.TS);
  const found: LongFunction[] = [];
  const visit = (node: ts.Node) => {
    if (ts.isFunctionLike(node) && "body" in node && node.body) {
      const first = source.getLineAndCharacterOfPosition(node.getStart(source)).line;
      const last = source.getLineAndCharacterOfPosition(node.getEnd()).line;
      const lines = last - first + 1;
      if (lines > max && !hasReason(node, source)) found.push({ file: fileName, name: nameOf(node), line: first + 1, lines });
    }
    ts.forEachChild(node, visit);
  };
  visit(source);
  return found;
}

function main(): number {
  const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");
  const configPath = ts.findConfigFile(root, ts.sys.fileExists, "tsconfig.json")!;
  const config = ts.parseJsonConfigFileContent(ts.readConfigFile(configPath, ts.sys.readFile).config, ts.sys, root);
  const args = process.argv.slice(2).map((f) => path.resolve(f));
  const files = args.length > 0 ? args : config.fileNames.filter((f) => f.startsWith(path.join(root, "src") + path.sep) && !/\.test\.tsx?$/.test(f));
  const rel = (f: string) => path.relative(root, f);
  const found = files.flatMap((f) => longFunctions(rel(f), ts.sys.readFile(f)!));
  const allowed = (f: LongFunction) => ALLOWED.some((a) => a.file === f.file && a.name === f.name);
  const failing = found.filter((f) => !allowed(f));
  const stale = args.length > 0 ? [] : ALLOWED.filter((a) => !found.some((f) => f.file === a.file && f.name === a.name));
  for (const f of found.filter(allowed)) console.log(`allowed for now: ${f.file}:${f.line} ${f.name} (${f.lines} lines)`);
  for (const a of stale) console.log(`✗ ${a.file} ${a.name} is in the allow-list but no longer over ${MAX_FUNCTION_LINES} lines: remove it from ALLOWED`);
  for (const f of failing) console.log(`✗ ${f.file}:${f.line} ${f.name} is ${f.lines} lines (over ${MAX_FUNCTION_LINES}): split it, or write "// long because: …" right above it`);
  console.log(`${files.length} files, ${failing.length} long function(s) without a reason, ${found.length - failing.length} allowed for now`);
  return failing.length > 0 || stale.length > 0 ? 1 : 0;
}

if (process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url)) process.exit(main());

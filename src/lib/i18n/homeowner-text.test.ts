// No homeowner-facing text outside the catalogs (issue #18 item 6). A plain scan of the files
// that speak to the homeowner, read with TypeScript's own parser:
// - e-mails and pages (.tsx): no JSX text with letters, and no literal text in the props that
//   print (label, heading, preview, note, placeholder, title, alt, aria-label);
// - PDF builders (.ts): no string or template literal holding two words or more.
// What may stay is listed in ALLOWED with its reason. It cannot see text built in another file
// and passed in (e.g. the snapshot's assumptions, which are data): those are named in
// DEVELOPERS.md.
import { readFileSync } from "node:fs";
import path from "node:path";
import ts from "typescript";
import { describe, expect, it } from "vitest";

const ROOT = path.resolve(__dirname, "../../..");

const HOMEOWNER_TSX = [
  "emails/components/layout.tsx",
  "emails/proposal-sent.tsx",
  "emails/signing-code.tsx",
  "emails/signed-copy.tsx",
  "emails/deposit-receipt.tsx",
  "emails/refund-issued.tsx",
  "src/app/p/[token]/page.tsx",
  "src/app/p/[token]/not-found.tsx",
  "src/app/p/[token]/proposal-view.tsx",
  "src/app/p/[token]/offer-details.tsx",
  "src/app/p/[token]/charts.tsx",
  "src/app/p/[token]/signing-panel.tsx",
  "src/app/p/[token]/signed-heading.tsx",
  "src/app/p/[token]/cancel-form.tsx",
  "src/app/p/[token]/question-form.tsx",
  "src/app/p/[token]/deposit-panel-client.tsx",
  "src/app/p/[token]/project-panel.tsx",
  "src/components/language-switch.tsx",
];
const HOMEOWNER_PDF = ["src/documents/proposal-pdf.ts", "src/documents/signed-pdf.ts", "src/documents/charts.ts", "src/documents/layout.ts"];

/** Text allowed to stay, by file: the exact literal and why. */
const ALLOWED: Record<string, Record<string, string>> = {
  "emails/components/layout.tsx": { Kilowright: "the product's name, not a word" },
  "src/app/p/[token]/proposal-view.tsx": { kW: "a unit, written the same in every language" },
  "src/documents/layout.ts": { "Kilowright documents (pdf-lib)": "the PDF's Producer field, read by software" },
};

const TEXT_PROPS = new Set(["label", "heading", "preview", "note", "placeholder", "title", "alt", "aria-label"]);
const WORDS = /[A-Za-z]{2,}\s+[A-Za-z]{2,}/;

function source(file: string): ts.SourceFile {
  return ts.createSourceFile(file, readFileSync(path.join(ROOT, file), "utf8"), ts.ScriptTarget.Latest, true, file.endsWith(".tsx") ? ts.ScriptKind.TSX : ts.ScriptKind.TS);
}

const isModuleName = (n: ts.Node) => ts.isImportDeclaration(n.parent) || ts.isExportDeclaration(n.parent) || ts.isExternalModuleReference(n.parent);
const isPreviewProps = (n: ts.Node): boolean => {
  for (let p: ts.Node | undefined = n; p; p = p.parent) {
    if (ts.isBinaryExpression(p) && p.left.getText().endsWith(".PreviewProps")) return true;
  }
  return false;
};
/** An error thrown for the server (`new XError(…)`): the page words what it shows the homeowner. */
const isErrorArgument = (n: ts.Node) => ts.isNewExpression(n.parent) && /Error$/.test(n.parent.expression.getText());

/** An object key, a type, an error, or a translator key (`t("cover.title")`). */
function isNotText(n: ts.Node): boolean {
  const parent = n.parent;
  if (isErrorArgument(n)) return true;
  if (ts.isPropertyAssignment(parent) && parent.name === n) return true;
  if (ts.isLiteralTypeNode(parent)) return true;
  if (ts.isCallExpression(parent) && parent.arguments[0] === n && /^(t|en|common|frameT|translator|.*\.rich)$/.test(parent.expression.getText())) return true;
  if (ts.isCallExpression(parent) && parent.expression.getText() === "translator") return true;
  if (ts.isConditionalExpression(parent) && ts.isCallExpression(parent.parent) && /^(t|en)$/.test(parent.parent.expression.getText())) return true;
  return false;
}

function textIn(file: string): string[] {
  const sf = source(file);
  const found: string[] = [];
  const tsx = file.endsWith(".tsx");
  const visit = (n: ts.Node) => {
    if (tsx && ts.isJsxText(n) && /[A-Za-z]{2,}/.test(n.getText())) found.push(n.getText().trim());
    if (tsx && ts.isJsxAttribute(n) && TEXT_PROPS.has(n.name.getText()) && n.initializer && ts.isStringLiteral(n.initializer)) found.push(n.initializer.text);
    if (!tsx && (ts.isStringLiteral(n) || ts.isNoSubstitutionTemplateLiteral(n)) && WORDS.test(n.text) && !isModuleName(n) && !isNotText(n)) found.push(n.text);
    if (!tsx && ts.isTemplateExpression(n) && !isErrorArgument(n)) {
      const parts = [n.head.text, ...n.templateSpans.map((s) => s.literal.text)].join(" ");
      if (WORDS.test(parts)) found.push(n.getText());
    }
    if (tsx && (ts.isStringLiteral(n) || ts.isNoSubstitutionTemplateLiteral(n)) && ts.isPropertyAssignment(n.parent) && TEXT_PROPS.has(n.parent.name.getText()) && !isPreviewProps(n)) found.push(n.text);
    ts.forEachChild(n, visit);
  };
  visit(sf);
  const allowed = ALLOWED[file] ?? {};
  return found.filter((t) => !(t in allowed));
}

describe("homeowner-facing files hold no hard-coded text", () => {
  for (const file of [...HOMEOWNER_TSX, ...HOMEOWNER_PDF]) {
    it(file, () => {
      expect(textIn(file)).toEqual([]);
    });
  }
});

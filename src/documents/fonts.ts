// The PDFs' fonts: IBM Plex Sans (text) and IBM Plex Mono (figures) from IBM's own packages
// (@ibm/plex-sans, @ibm/plex-mono), whose WOFF2 files the web pages use (src/app/fonts.css).
// The PDFs read the WOFF files of the same release: WOFF is the TrueType tables, each zlib-packed,
// which fontkit unpacks; its WOFF2 reader fails on empty glyphs (the space) when subsetting.
// pdf-lib embeds a TrueType subset either way. Never fetched at run time.
// The files are read once per process from node_modules under the working directory, which is
// the project root under `next start`, vitest and the scripts.
import fontkit from "@pdf-lib/fontkit";
import { existsSync, readFileSync } from "node:fs";
import path from "node:path";
import type { PDFDocument, PDFFont } from "pdf-lib";
import type { Font, Fontkit, Glyph } from "pdf-lib/cjs/types/fontkit";
import { useNativeDeflate } from "./deflate";

export type DocFonts = { sans: PDFFont; sansBold: PDFFont; mono: PDFFont };

const FONT_FILES = {
  sans: "@ibm/plex-sans/fonts/complete/woff/IBMPlexSans-Regular.woff",
  sansBold: "@ibm/plex-sans/fonts/complete/woff/IBMPlexSans-SemiBold.woff",
  mono: "@ibm/plex-mono/fonts/complete/woff/IBMPlexMono-Regular.woff",
} as const;

/**
 * Fixed PostScript names (pdf-lib would otherwise add a suffix; fixed names keep the bytes
 * stable), each with the six-letter tag and "+" the PDF format asks of a font subset
 * (ISO 32000-1, 9.6.4): two letters the caller picks plus four naming the face.
 */
const FONT_NAMES: Record<keyof typeof FONT_FILES, string> = {
  sans: "SANS+IBMPlexSans-Regular",
  sansBold: "SEMI+IBMPlexSans-SemiBold",
  mono: "MONO+IBMPlexMono-Regular",
};

let cache: Record<keyof typeof FONT_FILES, Uint8Array> | null = null;

/** node_modules holding the font packages: the working directory's, or the nearest above it. */
function findModulesDir(): string {
  let dir = process.cwd();
  for (;;) {
    const candidate = path.join(dir, "node_modules");
    if (existsSync(path.join(candidate, FONT_FILES.sans))) return candidate;
    const up = path.dirname(dir);
    if (up === dir) break;
    dir = up;
  }
  throw new Error(
    `PDF fonts not found: expected node_modules/${FONT_FILES.sans} under ${process.cwd()} or a folder above it (run from the project root after npm ci)`,
  );
}

/** The three font files' bytes (read once, then kept). */
export function fontBytes(): Record<keyof typeof FONT_FILES, Uint8Array> {
  if (!cache) {
    const modules = findModulesDir();
    const read = (rel: string) => new Uint8Array(readFileSync(path.join(modules, rel)));
    cache = { sans: read(FONT_FILES.sans), sansBold: read(FONT_FILES.sansBold), mono: read(FONT_FILES.mono) };
  }
  return cache;
}

/**
 * Glyphs straight from the font's character map, one per code point, without OpenType shaping.
 * pdf-lib calls `layout` for every width it measures and every string it draws, and fontkit's
 * full shaping (GSUB/GPOS lookups) made a proposal take seconds. pdf-lib uses only the glyphs
 * (not the kerning positions), so the result differs only by ligatures, which our documents do
 * not want anyway (a ligature makes "fi" one glyph in copied text).
 */
function cmapLayout(font: Font): Font["layout"] {
  const byCodePoint = new Map<number, Glyph>();
  return (text: string) => {
    const glyphs: Glyph[] = [];
    for (const ch of text) {
      const cp = ch.codePointAt(0) as number;
      let g = byCodePoint.get(cp);
      if (!g) {
        g = font.glyphForCodePoint(cp);
        byCodePoint.set(cp, g);
      }
      glyphs.push(g);
    }
    return { glyphs, positions: [] } as unknown as ReturnType<Font["layout"]>;
  };
}

/**
 * fontkit for pdf-lib that parses each font file once per process: parsing the tables is most
 * of the cost of embedding, and the parsed font is only read afterwards (each document makes its
 * own subset from it).
 */
const parsed = new Map<Uint8Array, Font>();
const cachingFontkit: Fontkit = {
  create(buffer: Uint8Array, postscriptName?: string): Font {
    let font = parsed.get(buffer);
    if (!font) {
      font = fontkit.create(buffer, postscriptName);
      font.layout = cmapLayout(font);
      parsed.set(buffer, font);
    }
    return font;
  },
};

/**
 * Embeds Plex Sans Regular, Plex Sans SemiBold and Plex Mono Regular in `pdf` (subset to the
 * glyphs used, so a document carries tens of kilobytes of font, not hundreds). A second set
 * embedded later in the same file (e.g. the signing stamp) takes another `subsetTag`.
 */
export async function embedFonts(pdf: PDFDocument, opts: { subsetTag?: string } = {}): Promise<DocFonts> {
  const tag = opts.subsetTag ?? "KW";
  if (!/^[A-Z]{2}$/.test(tag)) throw new RangeError(`subsetTag must be two capital letters, got "${tag}"`);
  pdf.registerFontkit(cachingFontkit);
  useNativeDeflate(pdf);
  const bytes = fontBytes();
  const [sans, sansBold, mono] = await Promise.all(
    (["sans", "sansBold", "mono"] as const).map((k) => pdf.embedFont(bytes[k], { subset: true, customName: tag + FONT_NAMES[k] })),
  );
  return { sans, sansBold, mono };
}

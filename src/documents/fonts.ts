// The PDFs' fonts: IBM Plex Sans (text) and IBM Plex Mono (figures), embedded as TrueType from
// the @expo-google-fonts packages shipped with the app (never WOFF2, never fetched at run time).
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
  sans: "@expo-google-fonts/ibm-plex-sans/400Regular/IBMPlexSans_400Regular.ttf",
  sansBold: "@expo-google-fonts/ibm-plex-sans/600SemiBold/IBMPlexSans_600SemiBold.ttf",
  mono: "@expo-google-fonts/ibm-plex-mono/400Regular/IBMPlexMono_400Regular.ttf",
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

const GLYPH_HEADER_PADDING = 16;

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

/** The three TrueType files' bytes (read once, then kept). */
export function fontBytes(): Record<keyof typeof FONT_FILES, Uint8Array> {
  if (!cache) {
    const modules = findModulesDir();
    const read = (rel: string) => {
      const file = readFileSync(path.join(modules, rel));
      // Plex Mono's space is the last glyph of the glyf table, which ends the file; fontkit reads
      // a glyph header (10 bytes) even for an empty glyph and would run past the end. Zero bytes
      // after the last table give it a blank header to read and change nothing else.
      const padded = new Uint8Array(file.length + GLYPH_HEADER_PADDING);
      padded.set(file);
      return padded;
    };
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

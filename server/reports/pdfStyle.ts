// Fonts and colours of the report PDF. Colours are Quarterbeat's own (the values of src/styles/palette.ts,
// repeated here because the server does not import client code).
import fs from "node:fs";
import { createRequire } from "node:module";
import path from "node:path";
import type PDFDocument from "pdfkit";

export type Doc = InstanceType<typeof PDFDocument>;
export type TextOptions = PDFKit.Mixins.TextOptions;

export const FONT = "QuarterbeatText";

interface FontSubset {
  name: string;
  file: string;
  ranges: [number, number][];
}

let subsets: FontSubset[] | undefined;

/**
 * The static Roboto Flex .woff files (weight 400) that pdfkit can embed, one per script subset, with the
 * code points each covers (read from the package's own CSS). Latin comes first: it is the report's font.
 */
export function fontSubsets(): FontSubset[] {
  if (subsets) return subsets;
  const require = createRequire(import.meta.url);
  const folder = path.dirname(require.resolve("@fontsource/roboto-flex/package.json"));
  const css = fs.readFileSync(path.join(folder, "400.css"), "utf8");
  const found: FontSubset[] = [];
  for (const block of css.split("@font-face").slice(1)) {
    const file = /url\(\.\/files\/([^)]+\.woff)\) format\('woff'\)/.exec(block)?.[1];
    const range = /unicode-range:\s*([^;]+);/.exec(block)?.[1];
    if (!file || !range) continue;
    const ranges = range.split(",").map((part) => {
      const [low, high] = part.trim().replace(/^U\+/i, "").split("-");
      return [parseInt(low, 16), parseInt(high ?? low, 16)] as [number, number];
    });
    const name = file.replace(/^roboto-flex-/, "").replace(/-400-normal\.woff$/, "");
    found.push({ name, file: path.join(folder, "files", file), ranges });
  }
  found.sort((a, b) => (a.name === "latin" ? -1 : b.name === "latin" ? 1 : 0));
  if (found[0]?.name !== "latin") throw new Error("The Roboto Flex latin .woff font was not found in @fontsource/roboto-flex.");
  subsets = found;
  return found;
}

export function fontName(subset: string): string {
  return subset === "latin" ? FONT : `${FONT}-${subset}`;
}

/** Registers every subset with the document under its font name. */
export function registerFonts(doc: Doc): void {
  for (const subset of fontSubsets()) doc.registerFont(fontName(subset.name), subset.file);
}

/**
 * Splits text typed by people (coordinator's note, network name) into runs that one subset font can draw.
 * Characters no subset has become "?", so the PDF never shows empty boxes.
 */
export function textRuns(text: string): { font: string; text: string }[] {
  const runs: { font: string; text: string }[] = [];
  for (const char of text) {
    const code = char.codePointAt(0)!;
    const isSpace = /\s/.test(char);
    const subset = isSpace ? fontSubsets()[0] : fontSubsets().find((s) => s.ranges.some(([low, high]) => code >= low && code <= high));
    const font = fontName(subset?.name ?? "latin");
    const shown = subset ? char : "?";
    const last = runs[runs.length - 1];
    if (last && (last.font === font || isSpace)) last.text += shown;
    else runs.push({ font, text: shown });
  }
  return runs;
}

export const colours = {
  ink: "#1C1B2E",
  muted: "#55536B",
  line: "#D9D5CA",
  paper: "#F6F4EE",
  brand: "#3F3A8C",
  brandDark: "#1F1C4A",
  brandSoft: "#A19BD9",
  band: "#E2E0F4",
  tint: "#F1F0FA",
  accent: "#E8A33D",
  accentDark: "#9A6410",
  highlight: "#FCF0DA",
  limit: "#D55E00",
  other: "#009E73",
} as const;

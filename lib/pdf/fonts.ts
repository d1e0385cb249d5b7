import { join } from "node:path";
import { Font } from "@react-pdf/renderer";

/** The family every Washproof PDF sets in. */
export const PDF_FONT = "Geist";

// Geist ships µ ° ± ≤ ≥; react-pdf would otherwise fall back silently and drop them.
const FONTS = join(process.cwd(), "node_modules/geist/dist/fonts/geist-sans");
Font.register({
  family: PDF_FONT,
  fonts: [
    { src: join(FONTS, "Geist-Regular.ttf") },
    { src: join(FONTS, "Geist-Bold.ttf"), fontWeight: "bold" },
    { src: join(FONTS, "Geist-Italic.ttf"), fontStyle: "italic" },
    { src: join(FONTS, "Geist-BoldItalic.ttf"), fontWeight: "bold", fontStyle: "italic" },
  ],
});
/** The monospace family for hashes and signatures: every character the same width, so a line of it has a known width. */
export const PDF_MONO_FONT = "GeistMono";
const MONO = join(process.cwd(), "node_modules/geist/dist/fonts/geist-mono");
Font.register({
  family: PDF_MONO_FONT,
  fonts: [
    { src: join(MONO, "GeistMono-Regular.ttf") },
    { src: join(MONO, "GeistMono-Bold.ttf"), fontWeight: "bold" },
  ],
});

/** A GeistMono character is 600/1000 of the font size wide (its advance width), digits and letters alike. */
export const MONO_ADVANCE_EM = 0.6;

// Hashes and codes must never be split with a hyphen.
Font.registerHyphenationCallback((word) => [word]);

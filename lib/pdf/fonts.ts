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
// Hashes and codes must never be split with a hyphen.
Font.registerHyphenationCallback((word) => [word]);

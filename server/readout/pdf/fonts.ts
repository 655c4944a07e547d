import { createRequire } from "node:module";
import { Font } from "@react-pdf/renderer";

// IBM Plex Sans from the installed @fontsource package (WOFF, which the PDF renderer reads): the
// report never fetches a font. Its latin subset has ±, ·, °, − but no arrows, so the report
// avoids them.
export const FONT = "IBM Plex Sans";

let registered = false;
export function registerFonts() {
  if (registered) return;
  const require = createRequire(import.meta.url);
  const file = (w: number) => require.resolve(`@fontsource/ibm-plex-sans/files/ibm-plex-sans-latin-${w}-normal.woff`);
  Font.register({ family: FONT, fonts: [{ src: file(400) }, { src: file(500), fontWeight: 500 }, { src: file(600), fontWeight: 600 }] });
  // Words are never broken with hyphens in the report.
  Font.registerHyphenationCallback((word) => [word]);
  registered = true;
}

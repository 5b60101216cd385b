/** Registers the workpaper's fonts from disk (DejaVu, shipped through the npm package dejavu-fonts-ttf). */
import fs from "node:fs";
import path from "node:path";
import { Font } from "@react-pdf/renderer";

export const SANS = "WorkpaperSans";
export const MONO = "WorkpaperMono";

let registered = false;

/**
 * The font folder. Resolved from process.cwd() first: under Next's bundler require.resolve of
 * some packages points into the build output, while the app always runs from the project root.
 */
export function fontDirectory(): string {
  const candidates = [
    path.join(process.cwd(), "node_modules", "dejavu-fonts-ttf", "ttf"),
    path.join(import.meta.dirname ?? "", "..", "..", "node_modules", "dejavu-fonts-ttf", "ttf"),
  ];
  const found = candidates.find((dir) => fs.existsSync(path.join(dir, "DejaVuSans.ttf")));
  if (!found)
    throw new Error(`Workpaper fonts not found: looked in ${candidates.join(", ")} (is dejavu-fonts-ttf installed?)`);
  return found;
}

export function registerWorkpaperFonts(): void {
  if (registered) return;
  const dir = fontDirectory();
  const file = (name: string) => path.join(dir, name);
  Font.register({
    family: SANS,
    fonts: [
      { src: file("DejaVuSans.ttf") },
      { src: file("DejaVuSans-Bold.ttf"), fontWeight: "bold" },
      { src: file("DejaVuSans-Oblique.ttf"), fontStyle: "italic" },
      { src: file("DejaVuSans-BoldOblique.ttf"), fontWeight: "bold", fontStyle: "italic" },
    ],
  });
  Font.register({
    family: MONO,
    fonts: [{ src: file("DejaVuSansMono.ttf") }, { src: file("DejaVuSansMono-Bold.ttf"), fontWeight: "bold" }],
  });
  // Words stay whole, except long unbroken tokens (SHA-256 digests, file names) which break every 16
  // characters so they wrap inside their column instead of running off the page.
  Font.registerHyphenationCallback((word) => (word.length > 24 ? (word.match(/.{1,16}/g) ?? [word]) : [word]));
  registered = true;
}

/** Test support: render a workpaper to a PDF in the temp folder and read it back with poppler. */
import { execFileSync } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { renderWorkpaper } from "@/templates/workpaper/render-workpaper";
import type { WorkpaperData } from "@/templates/workpaper/workpaper-data";

export interface RenderedPdf {
  file: string;
  bytes: Buffer;
  /** pdftotext -layout, one string per page. */
  pages: string[];
  text: string;
  /** pdftotext in reading order with all whitespace collapsed, for phrases that wrap. */
  flat: string;
  pageCount: number;
}

const dir = path.join(os.tmpdir(), "sondage-workpaper-tests");
fs.mkdirSync(dir, { recursive: true });

export async function renderAndRead(name: string, data: WorkpaperData): Promise<RenderedPdf> {
  const bytes = await renderWorkpaper(data);
  const file = path.join(dir, `${name}.pdf`);
  fs.writeFileSync(file, bytes);
  const text = execFileSync("pdftotext", ["-layout", file, "-"], { encoding: "utf8" });
  const pages = text.split("\f").filter((page, i, all) => i < all.length - 1 || page.trim() !== "");
  const flat = execFileSync("pdftotext", [file, "-"], { encoding: "utf8" }).replace(/\s+/g, " ");
  return { file, bytes, pages, text, flat, pageCount: pageCount(file) };
}

export function pageCount(file: string): number {
  const info = execFileSync("pdfinfo", [file], { encoding: "utf8" });
  return Number(/Pages:\s+(\d+)/.exec(info)?.[1]);
}

/** PNG previews (60 dpi) under test-results/workpaper/ for a person to look at. */
export function previewPngs(file: string, name: string): string[] {
  const out = path.join(import.meta.dirname, "..", "..", "..", "..", "test-results", "workpaper");
  fs.mkdirSync(out, { recursive: true });
  for (const old of fs.readdirSync(out).filter((f) => f.startsWith(`${name}-`))) fs.rmSync(path.join(out, old));
  execFileSync("pdftoppm", ["-png", "-r", "60", file, path.join(out, name)]);
  return fs
    .readdirSync(out)
    .filter((f) => f.startsWith(`${name}-`))
    .sort()
    .map((f) => path.join(out, f));
}

/** Collapses runs of spaces so phrases wrapped by -layout columns can be matched. */
export function squash(text: string): string {
  return text.replace(/[ \t]+/g, " ");
}

/**
 * Pixels of the watermark's faint red (r above g, g ≈ b) in the middle band of a page, read from
 * a 30 dpi PPM rendering; the draft banner at the top is outside the band.
 */
export function watermarkPixels(file: string, page: number): number {
  const ppm = execFileSync("pdftoppm", ["-r", "30", "-f", String(page), "-l", String(page), file], {
    maxBuffer: 1 << 26,
  });
  const header = /^P6\s+(\d+)\s+(\d+)\s+255\s/.exec(ppm.subarray(0, 40).toString("latin1"));
  if (!header) throw new Error("pdftoppm did not return a P6 image");
  const [width, height] = [Number(header[1]), Number(header[2])];
  const start = header[0].length;
  let count = 0;
  for (let y = Math.floor(height * 0.3); y < Math.floor(height * 0.8); y++) {
    for (let x = 0; x < width; x++) {
      const i = start + (y * width + x) * 3;
      const [r, g, b] = [ppm[i], ppm[i + 1], ppm[i + 2]];
      if (r - g >= 5 && Math.abs(g - b) <= 2) count++;
    }
  }
  return count;
}

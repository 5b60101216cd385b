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
  return fs.readdirSync(out).filter((f) => f.startsWith(`${name}-`)).sort().map((f) => path.join(out, f));
}

/** Collapses runs of spaces so phrases wrapped by -layout columns can be matched. */
export function squash(text: string): string {
  return text.replace(/[ \t]+/g, " ");
}

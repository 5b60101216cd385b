/**
 * Renders the sample workpaper to PDF bytes.
 *
 * How to call it (samples / workpaper server code):
 * 1. Build a `WorkpaperData` (./workpaper-data.ts) from the sample: engagement and firm names,
 *    population row (file name, SHA-256, counts, totals as DECIMAL strings), the stored plan
 *    (formula text, inputs, computed/chosen size, reason), the current draw (seed, algorithm and
 *    version, selection SHA-256, re-perform result, recipe split into lines), every item row,
 *    the evaluation block (build it with ./build-evaluation.ts from the engine's results, so the
 *    printed table is the engine's own numbers), the conclusion, review notes, sign-offs and the
 *    sample's audit_log rows. Money stays a decimal string throughout; times are ISO strings.
 * 2. `const pdf = await renderWorkpaper(data)`: a Buffer holding the PDF. Set `draft: true` (and
 *    `lock: null`) for the preview before lock: every page is then watermarked as a draft.
 * 3. At lock: render once with `draft: false` and the lock info filled in, store the bytes
 *    (object storage) with their SHA-256 (`createHash("sha256").update(pdf).digest("hex")`) and
 *    the WorkpaperData JSON beside them, in the same transaction that records the lock in the
 *    audit log. Serve the stored bytes afterwards; never re-render a locked workpaper.
 *
 * Fonts are registered from disk on the first call (DejaVu from node_modules/dejavu-fonts-ttf,
 * resolved from process.cwd()); @react-pdf/renderer must stay in next.config's
 * serverExternalPackages.
 */
import { createElement, type ReactElement } from "react";
import { renderToBuffer, type DocumentProps } from "@react-pdf/renderer";
import { registerWorkpaperFonts } from "./fonts";
import { WorkpaperDocument } from "./workpaper-document";
import type { WorkpaperData } from "./workpaper-data";

export type { WorkpaperData } from "./workpaper-data";

export async function renderWorkpaper(data: WorkpaperData): Promise<Buffer> {
  registerWorkpaperFonts();
  const element = createElement(WorkpaperDocument, { data }) as unknown as ReactElement<DocumentProps>;
  return renderToBuffer(element);
}

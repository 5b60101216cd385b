/**
 * Renders the summary of misstatements to PDF bytes, from the summary's view model (the same object
 * the page, API and workbook print). `draft: true` watermarks every page; at lock, render once with
 * `draft: false`, store the bytes with their SHA-256 and serve them afterwards.
 */
import { createElement, type ReactElement } from "react";
import { renderToBuffer, type DocumentProps } from "@react-pdf/renderer";
import type { SummaryView } from "@/lib/misstatements/types";
import { registerWorkpaperFonts } from "../workpaper/fonts";
import { SummaryDocument } from "./summary-document";

export async function renderSummaryWorkpaper(view: SummaryView, { draft }: { draft: boolean }): Promise<Buffer> {
  registerWorkpaperFonts();
  const element = createElement(SummaryDocument, { view, draft }) as unknown as ReactElement<DocumentProps>;
  return renderToBuffer(element);
}

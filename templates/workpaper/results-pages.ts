/**
 * Splits the results table into page-sized runs of rows. react-pdf lays out the whole remainder of a
 * <Page> again for every page it breaks, so one long table costs time quadratic in its length
 * (measured: 300 rows 2.5 s, 1,000 rows 21 s). Each run becomes its own <Page>, so the cost stays
 * linear. Heights are estimated on the generous side: a run that still overflows simply wraps to
 * one more page (with its header row repeated), it is never cut.
 */
import type { WorkpaperItem } from "./workpaper-data";

/** Usable height of a page body (A4 less the page padding), and what the table spends around rows. */
const BODY_HEIGHT = 841.89 - 78 - 62;
const HEADER_ROW = 16;
const SECTION_INTRO = 62;
const LINE = 9.9;
const ROW_PADDING = 5.6;
/** Characters per line in the two wrapping columns (DejaVu Sans at 7.5 pt, about 4.3 pt a glyph). */
const REFERENCE_CHARS = 34;
const NOTE_CHARS = 26;
const TAG_CHARS = 38;

const lines = (text: string | null | undefined, perLine: number) => (text ? Math.ceil(text.length / perLine) : 0);

export function estimateRowHeight(item: WorkpaperItem): number {
  const tags = `row ${item.rowNumber}${item.hitPoints.length ? ` · hit at ${item.hitPoints.join(", ")}` : ""}${item.topStratum ? " · top stratum" : ""}`;
  const reference = lines(`${item.reference}  ${item.description ?? ""}`, REFERENCE_CHARS) + lines(tags, TAG_CHARS);
  const note =
    lines(item.deviationNature, NOTE_CHARS) + lines(item.cause, NOTE_CHARS) + lines(item.comment, NOTE_CHARS);
  return ROW_PADDING + LINE * Math.max(1, reference, note);
}

/** Runs of item indices, each expected to fill one page; the first page also holds the section intro. */
export function paginateItems(items: WorkpaperItem[]): WorkpaperItem[][] {
  const runs: WorkpaperItem[][] = [];
  let run: WorkpaperItem[] = [];
  let room = BODY_HEIGHT - SECTION_INTRO - HEADER_ROW;
  for (const item of items) {
    const height = estimateRowHeight(item);
    if (height > room && run.length > 0) {
      runs.push(run);
      run = [];
      room = BODY_HEIGHT - HEADER_ROW;
    }
    run.push(item);
    room -= height;
  }
  // The total row follows the last run; if it does not fit, react-pdf carries it over under the header.
  if (run.length > 0 || runs.length === 0) runs.push(run);
  return runs;
}

/**
 * A column copied from a spreadsheet, as the values to put in consecutive rows: one value per line
 * (the first cell when a line has several), without the trailing line break spreadsheets add.
 * Currency symbols and spaces are dropped and accounting parentheses read as a minus; everything
 * else (thousands commas, typing mistakes) goes to the server, which names the row it refuses.
 * Returns null for a single value, which is an ordinary paste into one cell.
 */
export function readPastedColumn(text: string): string[] | null {
  const lines = text.split(/\r\n|\n|\r/);
  if (lines.length > 1 && lines.at(-1) === "") lines.pop();
  if (lines.length < 2) return null;
  return lines.map((line) => cleanAmount(line.split("\t")[0] ?? ""));
}

function cleanAmount(cell: string): string {
  const s = cell.replace(/[\s\u00a0$€£¥]/g, "");
  const bracketed = /^\((.*)\)$/.exec(s);
  return bracketed ? `-${bracketed[1]}` : s;
}

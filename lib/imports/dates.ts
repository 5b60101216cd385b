import "server-only";

/** How a slash- or dot-separated date such as 03/04/2024 is read. ISO dates need no order. */
export type DateOrder = "day-first" | "month-first";

const MS_PER_DAY = 86_400_000;
const EXCEL_1900_EPOCH = Date.UTC(1899, 11, 31);
const EXCEL_1904_EPOCH = Date.UTC(1904, 0, 1);
const LARGEST_SERIAL = 2_958_465; // 9999-12-31, the last date Excel accepts

/**
 * Excel date serial to ISO date (YYYY-MM-DD), ignoring the time of day.
 * 1900 date system: serial 1 = 1900-01-01, and serial 60 is the non-existent 1900-02-29 that
 * Excel keeps for Lotus 1-2-3 compatibility, so serials from 61 on are one day later than a plain
 * count (Microsoft Learn, "Date systems in Excel" and "Excel incorrectly assumes that the year
 * 1900 is a leap year"). 1904 system: serial 0 = 1904-01-01. Returns null for serial 60 and
 * for serials outside 1..2958465.
 * @example excelSerialToIsoDate(45292) // "2024-01-01"
 */
export function excelSerialToIsoDate(serial: number, date1904 = false): string | null {
  const day = Math.floor(serial);
  if (!Number.isFinite(serial) || day < (date1904 ? 0 : 1) || day > LARGEST_SERIAL) return null;
  if (date1904) return isoFromUtc(EXCEL_1904_EPOCH + day * MS_PER_DAY);
  if (day === 60) return null;
  return isoFromUtc(EXCEL_1900_EPOCH + (day > 60 ? day - 1 : day) * MS_PER_DAY);
}

/** A JS Date (as exceljs gives for date cells, in UTC) to its ISO calendar date. */
export function dateToIsoDate(date: Date): string | null {
  return Number.isNaN(date.getTime()) ? null : isoFromUtc(date.getTime());
}

// A ledger's dates repeat (a few hundred days a year), so each day's text is made once.
const isoByDay = new Map<number, string>();

function isoFromUtc(ms: number): string {
  const day = Math.floor(ms / MS_PER_DAY);
  let iso = isoByDay.get(day);
  if (iso === undefined) {
    iso = new Date(day * MS_PER_DAY).toISOString().slice(0, 10);
    if (isoByDay.size >= 100_000) isoByDay.clear();
    isoByDay.set(day, iso);
  }
  return iso;
}

const PLAIN_ISO = /^\d{4}-\d{2}-\d{2}$/;
const ISO = /^(\d{4})-(\d{1,2})-(\d{1,2})(?:[T ][\d:.]+(?:Z|[+-]\d{2}:?\d{2})?)?$/;
const YEAR_FIRST = /^(\d{4})[/.](\d{1,2})[/.](\d{1,2})$/;
const YEAR_LAST = /^(\d{1,2})[/.-](\d{1,2})[/.-](\d{4})(?: [\d:.]+)?$/;

/**
 * Reads a date written as text: 2024-01-31 (optionally with a time), 2024/01/31, or
 * 31/01/2024 / 01/31/2024 per `order`. Two-digit years are refused (the century is a guess).
 * @returns ISO date, or null when the text is not a real calendar date.
 */
export function parseDateText(text: string, order: DateOrder): string | null {
  if (PLAIN_ISO.test(text)) {
    return isoIfValid(Number(text.slice(0, 4)), Number(text.slice(5, 7)), Number(text.slice(8, 10))) === null
      ? null
      : text;
  }
  const s = text.trim();
  let m = ISO.exec(s) ?? YEAR_FIRST.exec(s);
  if (m) return isoIfValid(Number(m[1]), Number(m[2]), Number(m[3]));
  m = YEAR_LAST.exec(s);
  if (!m) return null;
  const [first, second] = [Number(m[1]), Number(m[2])];
  return order === "day-first" ? isoIfValid(Number(m[3]), second, first) : isoIfValid(Number(m[3]), first, second);
}

const DAYS_IN_MONTH = [31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31];

/** Gregorian rule: every 4th year, except centuries not divisible by 400. */
function isLeapYear(year: number): boolean {
  return year % 4 === 0 && (year % 100 !== 0 || year % 400 === 0);
}

function isoIfValid(year: number, month: number, day: number): string | null {
  if (year < 1000 || month < 1 || month > 12 || day < 1) return null;
  if (day > (month === 2 ? (isLeapYear(year) ? 29 : 28) : DAYS_IN_MONTH[month - 1])) return null;
  return `${year}-${String(month).padStart(2, "0")}-${String(day).padStart(2, "0")}`;
}

/** Day-first if some sample date has a first part over 12, month-first if a second part is; else null. */
export function detectDateOrder(values: Iterable<string>): DateOrder | null {
  let dayFirst = false;
  let monthFirst = false;
  for (const value of values) {
    const m = YEAR_LAST.exec(value.trim());
    if (!m) continue;
    if (Number(m[1]) > 12) dayFirst = true;
    if (Number(m[2]) > 12) monthFirst = true;
  }
  if (dayFirst === monthFirst) return null;
  return dayFirst ? "day-first" : "month-first";
}

/**
 * Whether a cell number format shows a date: it has d, m or y outside quoted text, escapes and
 * [colour]/[$-locale] brackets (ECMA-376 Part 1, §18.8.31 numFmt; common practice).
 */
export function isDateNumberFormat(format: string | undefined): boolean {
  if (!format) return false;
  const bare = format
    .replace(/"[^"]*"/g, "")
    .replace(/\\./g, "")
    .replace(/\[[^\]]*\]/g, "");
  return /[dmy]/i.test(bare) && !/^general$/i.test(bare.trim());
}

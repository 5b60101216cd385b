import "server-only";
import type { Frame } from "./population-frame";

export interface FrameStratum {
  number: number; // 1-based
  label: string;
  lowerExclusive: number | null;
  upperInclusive: number | null;
  /** Positions in the frame (population order) of the stratum's items. */
  members: number[];
  bookCents: bigint;
}

/** Splits the frame into book-value bands: (−∞, b1], (b1, b2], …, (bk, ∞). */
export function stratifyFrame(frame: Frame, bounds: number[]): FrameStratum[] {
  const strata: FrameStratum[] = [...bounds, null].map((upper, h) => ({
    number: h + 1,
    lowerExclusive: h === 0 ? null : bounds[h - 1],
    upperInclusive: upper,
    label:
      h === 0
        ? `up to ${bounds[0].toLocaleString("en-US")}`
        : upper === null
          ? `above ${bounds[h - 1].toLocaleString("en-US")}`
          : `${bounds[h - 1].toLocaleString("en-US")} – ${upper.toLocaleString("en-US")}`,
    members: [],
    bookCents: 0n,
  }));
  for (let i = 0; i < frame.bookValues.length; i++) {
    const v = frame.bookValues[i];
    let h = bounds.findIndex((b) => v <= b);
    if (h === -1) h = bounds.length;
    strata[h].members.push(i);
    strata[h].bookCents += frame.bookCents[i];
  }
  return strata;
}

/** Counts as the rest of the product prints them: "1,234". */
export const formatCount = (n: number) => n.toLocaleString("en-US");

/** "1 item", "2 items", "1,204 items" — never "1 items". `plural` defaults to singular + "s". */
export function countOf(n: number, singular: string, plural = `${singular}s`): string {
  return `${formatCount(n)} ${n === 1 ? singular : plural}`;
}

/** A LIKE pattern matching `text` anywhere, with LIKE's own wildcards in it taken literally. */
export function containsPattern(text: string): string {
  return `%${text.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
}

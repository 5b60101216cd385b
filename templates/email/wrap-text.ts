/** Wraps a paragraph for the plain-text part at about 72 columns; long words (links) stay whole. */
export function wrapText(text: string, width = 72, indent = ""): string {
  return text
    .split("\n")
    .map((line) => {
      const out: string[] = [];
      let current = "";
      for (const word of line.split(/ +/)) {
        if (current && current.length + 1 + word.length > width - indent.length) {
          out.push(current);
          current = word;
        } else current = current ? `${current} ${word}` : word;
      }
      out.push(current);
      return out.map((l) => indent + l).join("\n");
    })
    .join("\n");
}

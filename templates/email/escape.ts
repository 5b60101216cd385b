// Escaping for the e-mail bodies: everything a person typed goes through here before it reaches HTML.

const HTML_ENTITIES: Record<string, string> = { "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" };

/** Text made safe for HTML element content and quoted attribute values. */
export function escapeHtml(value: string): string {
  return value.replace(/[&<>"']/g, (c) => HTML_ENTITIES[c]);
}

/** A link we put in a message: absolute http(s) only, so no `javascript:` or relative surprise gets through. */
export function safeUrl(value: string, field: string): string {
  let url: URL;
  try {
    url = new URL(value);
  } catch {
    throw new TypeError(`${field}: not an absolute URL (${JSON.stringify(value)})`);
  }
  if (url.protocol !== "http:" && url.protocol !== "https:")
    throw new TypeError(`${field}: links must use http or https`);
  return url.href;
}

/** One header-safe line: newlines and runs of spaces become one space (subjects carry user text). */
export function oneLine(value: string): string {
  return value.replace(/\s+/g, " ").trim();
}

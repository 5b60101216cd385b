// The shared Sondage e-mail layout. Templates describe content as plain-text blocks; this module
// renders both parts from them, escaping every value, so no template writes HTML of its own.
import { escapeHtml, oneLine, safeUrl } from "./escape";
import type { RenderedEmail } from "./types";
import { wrapText } from "@/templates/email/wrap-text";

export type Block =
  | { kind: "paragraph"; text: string }
  | { kind: "facts"; rows: [label: string, value: string][] }
  | { kind: "quote"; label: string; text: string };

export interface EmailContent {
  subject: string;
  /** The line mail clients show beside the subject. */
  preview: string;
  greeting: string;
  blocks: Block[];
  action: { label: string; url: string };
  /** Sample messages remind the reader that the results support, not replace, their judgement. */
  judgementCaution: boolean;
  footer: string;
}

export const JUDGEMENT_CAUTION =
  "The sample's figures support, and never replace, the auditor's professional judgement, the applicable " +
  "standards (AU-C 530, ISA 530, AS 2315) and the firm's methodology; its conclusions rest on the engagement team's judgement.";

const COLOURS = {
  paper: "#f6f4ee",
  raised: "#fffdf8",
  ink: "#1d2430",
  soft: "#4a5363",
  faint: "#7b8494",
  line: "#d9d4c7",
  ledger: "#24663f",
  ledgerDark: "#1b5132",
  ledgerWash: "#eef6f1",
};
const FONT = "-apple-system,'Segoe UI',Roboto,Helvetica,Arial,sans-serif";

function textBlock(block: Block): string {
  switch (block.kind) {
    case "paragraph":
      return wrapText(block.text);
    case "facts": {
      const width = Math.max(...block.rows.map(([label]) => label.length)) + 2;
      return block.rows.map(([label, value]) => `  ${`${label}:`.padEnd(width)}${oneLine(value)}`).join("\n");
    }
    case "quote":
      return `${block.label}:\n${wrapText(block.text, 72, "> ")}`;
  }
}

function htmlBlock(block: Block): string {
  const p = `margin:0 0 16px;font:15px/1.55 ${FONT};color:${COLOURS.ink}`;
  switch (block.kind) {
    case "paragraph":
      return `<p style="${p}">${escapeHtml(block.text)}</p>`;
    case "facts":
      return (
        `<table role="presentation" cellpadding="0" cellspacing="0" style="margin:0 0 16px;border-collapse:collapse;font:14px/1.5 ${FONT}">` +
        block.rows
          .map(
            ([label, value]) =>
              `<tr><td style="padding:3px 16px 3px 0;color:${COLOURS.soft};white-space:nowrap;vertical-align:top">${escapeHtml(label)}</td>` +
              `<td style="padding:3px 0;color:${COLOURS.ink}">${escapeHtml(oneLine(value))}</td></tr>`,
          )
          .join("") +
        `</table>`
      );
    case "quote":
      return (
        `<p style="margin:0 0 6px;font:600 13px/1.4 ${FONT};color:${COLOURS.soft}">${escapeHtml(block.label)}</p>` +
        `<div style="margin:0 0 16px;padding:10px 14px;border-left:3px solid ${COLOURS.ledger};background:${COLOURS.ledgerWash};font:15px/1.55 ${FONT};color:${COLOURS.ink};white-space:pre-wrap">${escapeHtml(block.text)}</div>`
      );
  }
}

function renderText(c: EmailContent, url: string): string {
  const parts = [
    "SONDAGE\n=======",
    c.greeting,
    ...c.blocks.map(textBlock),
    `${c.action.label}:\n${url}`,
    ...(c.judgementCaution ? [wrapText(JUDGEMENT_CAUTION)] : []),
    `-- \n${wrapText(c.footer)}`,
  ];
  return `${parts.join("\n\n")}\n`;
}

function renderHtml(c: EmailContent, subject: string, url: string): string {
  const href = escapeHtml(url);
  const small = `margin:0 0 12px;font:13px/1.5 ${FONT};color:${COLOURS.soft}`;
  const caution = c.judgementCaution
    ? `<p style="${small};border-top:1px solid ${COLOURS.line};padding-top:14px">${escapeHtml(JUDGEMENT_CAUTION)}</p>`
    : "";
  return (
    `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width,initial-scale=1">` +
    `<title>${escapeHtml(subject)}</title></head><body style="margin:0;padding:0;background:${COLOURS.paper}">` +
    `<div style="display:none;max-height:0;overflow:hidden">${escapeHtml(c.preview)}</div>` +
    `<table role="presentation" width="100%" cellpadding="0" cellspacing="0" style="background:${COLOURS.paper}"><tr><td align="center" style="padding:28px 12px">` +
    `<table role="presentation" width="100%" cellpadding="0" cellspacing="0" style="max-width:580px;background:${COLOURS.raised};border:1px solid ${COLOURS.line};border-top:4px solid ${COLOURS.ledger};border-radius:10px">` +
    `<tr><td style="padding:22px 28px 6px;font:700 19px/1 ${FONT};letter-spacing:0.04em;color:${COLOURS.ledgerDark}">Sondage</td></tr>` +
    `<tr><td style="padding:14px 28px 20px">` +
    `<p style="margin:0 0 16px;font:15px/1.55 ${FONT};color:${COLOURS.ink}">${escapeHtml(c.greeting)}</p>` +
    c.blocks.map(htmlBlock).join("") +
    `<p style="margin:8px 0 18px"><a href="${href}" style="display:inline-block;padding:10px 18px;border-radius:6px;background:${COLOURS.ledger};color:#ffffff;font:600 15px/1.2 ${FONT};text-decoration:none">${escapeHtml(c.action.label)}</a></p>` +
    `<p style="${small}">Or open this address: <a href="${href}" style="color:${COLOURS.ledgerDark};word-break:break-all">${href}</a></p>` +
    caution +
    `</td></tr></table>` +
    `<p style="max-width:580px;margin:14px auto 0;font:12px/1.5 ${FONT};color:${COLOURS.faint}">${escapeHtml(c.footer)}</p>` +
    `</td></tr></table></body></html>`
  );
}

/** Both parts of a message from one description; the subject is kept to one line. */
export function renderEmail(content: EmailContent): RenderedEmail {
  const subject = oneLine(content.subject);
  const url = safeUrl(content.action.url, "action.url");
  return { subject, text: renderText(content, url), html: renderHtml(content, subject, url) };
}

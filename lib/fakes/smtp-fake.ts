// A local SMTP catcher on loopback (smtp-server + mailparser) with a JSON inbox, for development and
// tests. Not used in production: there the same nodemailer transport points at a real SMTP server.
import fs from "node:fs";
import http from "node:http";
import path from "node:path";
import { randomUUID } from "node:crypto";
import type { AddressInfo } from "node:net";
import { SMTPServer } from "smtp-server";
import { simpleParser, type AddressObject } from "mailparser";

export interface CaughtMessage {
  id: string;
  from: string;
  to: string[];
  cc: string[];
  envelopeTo: string[];
  subject: string;
  text: string;
  html: string;
  date: string;
}

export interface SmtpFake {
  smtpPort: number;
  inboxUrl: string;
  messages(): CaughtMessage[];
  close(): Promise<void>;
}

const MAX_MESSAGE_BYTES = 10 * 1024 * 1024;

function addresses(field: AddressObject | AddressObject[] | undefined): string[] {
  const list = field === undefined ? [] : Array.isArray(field) ? field : [field];
  return list
    .flatMap((a) => a.value)
    .map((v) => v.address ?? "")
    .filter(Boolean);
}

const esc = (s: string) => s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);

function page(title: string, body: string): string {
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><title>${esc(title)}</title><style>
body{font:15px/1.5 system-ui,sans-serif;color:#1d2430;background:#f6f4ee;margin:0;padding:24px 32px}
h1{font-size:18px;margin:0 0 4px}h1 b{color:#24663f}p.hint{color:#7b8494;margin:0 0 16px}
table{border-collapse:collapse;width:100%;background:#fffdf8}td,th{text-align:left;padding:8px 10px;border-bottom:1px solid #d9d4c7;vertical-align:top}
th{font-size:12px;text-transform:uppercase;letter-spacing:.04em;color:#4a5363}a{color:#1b5132}
pre{white-space:pre-wrap;background:#fffdf8;border:1px solid #d9d4c7;padding:12px}iframe{width:100%;height:520px;border:1px solid #d9d4c7;background:#fff}
</style></head><body><h1><b>Sondage</b> · local mail catcher</h1>${body}</body></html>`;
}

function inboxPage(messages: CaughtMessage[]): string {
  const rows = messages
    .map(
      (m) =>
        `<tr><td>${esc(new Date(m.date).toLocaleString("en-GB"))}</td><td>${esc(m.to.join(", "))}</td>` +
        `<td><a href="/view/${encodeURIComponent(m.id)}">${esc(m.subject || "(no subject)")}</a></td></tr>`,
    )
    .join("");
  return page(
    "Inbox",
    `<p class="hint">${messages.length} message(s), newest first. JSON at <a href="/messages">/messages</a>. Nothing here leaves this machine.</p>` +
      `<table><thead><tr><th>received</th><th>to</th><th>subject</th></tr></thead><tbody>${rows}</tbody></table>`,
  );
}

function messagePage(m: CaughtMessage): string {
  return page(
    m.subject,
    `<p class="hint"><a href="/">← inbox</a></p><table><tbody>` +
      `<tr><th>from</th><td>${esc(m.from)}</td></tr><tr><th>to</th><td>${esc(m.to.join(", "))}</td></tr>` +
      `<tr><th>subject</th><td>${esc(m.subject)}</td></tr><tr><th>date</th><td>${esc(m.date)}</td></tr></tbody></table>` +
      `<h2>HTML part</h2><iframe sandbox="" srcdoc="${esc(m.html)}"></iframe><h2>Plain-text part</h2><pre>${esc(m.text)}</pre>`,
  );
}

function loadSaved(directory: string | undefined): CaughtMessage[] {
  if (!directory) return [];
  fs.mkdirSync(directory, { recursive: true });
  return fs
    .readdirSync(directory)
    .filter((f) => f.endsWith(".json"))
    .map((f) => JSON.parse(fs.readFileSync(path.join(directory, f), "utf8")) as CaughtMessage)
    .sort((a, b) => b.date.localeCompare(a.date));
}

type Listener = {
  listen(port: number, host: string, cb: () => void): unknown;
  once(e: "error", cb: (err: Error) => void): unknown;
};

function listen(server: Listener, port: number) {
  return new Promise<void>((resolve, reject) => {
    server.once("error", reject);
    server.listen(port, "127.0.0.1", resolve);
  });
}

/** Accepts mail on 127.0.0.1:smtpPort (no auth, no TLS) and serves the inbox on http://127.0.0.1:inboxPort. */
export async function startSmtpFake({
  smtpPort,
  inboxPort,
  directory,
}: {
  smtpPort: number;
  inboxPort: number;
  directory?: string;
}): Promise<SmtpFake> {
  let inbox = loadSaved(directory);

  const smtp = new SMTPServer({
    authOptional: true,
    disabledCommands: ["AUTH", "STARTTLS"],
    size: MAX_MESSAGE_BYTES,
    logger: false,
    banner: "Sondage local mail catcher",
    onData(stream, session, callback) {
      simpleParser(stream).then(
        (mail) => {
          const message: CaughtMessage = {
            id: randomUUID(),
            from: mail.from?.text ?? "",
            to: addresses(mail.to),
            cc: addresses(mail.cc),
            envelopeTo: session.envelope.rcptTo.map((r) => r.address),
            subject: mail.subject ?? "",
            text: mail.text ?? "",
            html: mail.html || "",
            date: new Date().toISOString(),
          };
          inbox = [message, ...inbox];
          if (directory) fs.writeFileSync(path.join(directory, `${message.id}.json`), JSON.stringify(message, null, 2));
          callback();
        },
        (err: Error) => callback(err),
      );
    },
  });

  const web = http.createServer((req, res) => {
    const url = new URL(req.url ?? "/", "http://127.0.0.1");
    const send = (status: number, type: string, body: string) => {
      res.writeHead(status, { "content-type": type });
      res.end(body);
    };
    const json = (status: number, body: unknown) => send(status, "application/json", JSON.stringify(body));
    const byId = (id: string) => inbox.find((m) => m.id === decodeURIComponent(id));
    const [, first, id] = url.pathname.split("/");
    if (req.method === "GET" && url.pathname === "/") return send(200, "text/html; charset=utf-8", inboxPage(inbox));
    if (req.method === "GET" && first === "messages" && !id) return json(200, inbox);
    if (req.method === "DELETE" && first === "messages" && !id) {
      if (directory) for (const m of inbox) fs.rmSync(path.join(directory, `${m.id}.json`), { force: true });
      inbox = [];
      return send(204, "text/plain", "");
    }
    const found = id ? byId(id) : undefined;
    if (req.method === "GET" && first === "messages" && found) return json(200, found);
    if (req.method === "GET" && first === "view" && found)
      return send(200, "text/html; charset=utf-8", messagePage(found));
    return json(404, { error: "not found" });
  });

  await listen(smtp, smtpPort);
  await listen(web, inboxPort).catch((err: unknown) => {
    smtp.close(() => undefined);
    throw err;
  });
  smtp.on("error", (err) => console.error("smtp fake:", err.message)); // a client's broken connection, not ours
  const boundSmtp = (smtp.server.address() as AddressInfo).port;
  const boundInbox = (web.address() as AddressInfo).port;
  return {
    smtpPort: boundSmtp,
    inboxUrl: `http://127.0.0.1:${boundInbox}`,
    messages: () => inbox,
    close: async () => {
      web.closeAllConnections();
      await Promise.all([
        new Promise<void>((r) => smtp.close(() => r())),
        new Promise<void>((r) => web.close(() => r())),
      ]);
    },
  };
}

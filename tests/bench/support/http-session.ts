import { createReadStream, statSync } from "node:fs";
import http from "node:http";

/** A signed-in HTTP client for the running app: keeps the cookies next-auth sets. */
export class HttpSession {
  private readonly cookies = new Map<string, string>();

  constructor(readonly baseUrl: string) {}

  private keepCookies(res: Response): void {
    for (const line of res.headers.getSetCookie()) {
      const [pair] = line.split(";");
      const eq = pair.indexOf("=");
      this.cookies.set(pair.slice(0, eq).trim(), pair.slice(eq + 1).trim());
    }
  }

  cookieHeader(): string {
    return [...this.cookies].map(([k, v]) => `${k}=${v}`).join("; ");
  }

  async fetch(path: string, init: RequestInit = {}): Promise<Response> {
    const headers = new Headers(init.headers);
    if (this.cookies.size) headers.set("cookie", this.cookieHeader());
    const res = await fetch(this.baseUrl + path, { ...init, headers, redirect: "manual" });
    this.keepCookies(res);
    return res;
  }

  async json<T>(path: string, init: RequestInit = {}): Promise<T> {
    const res = await this.fetch(path, init);
    const text = await res.text();
    if (!res.ok) throw new Error(`${init.method ?? "GET"} ${path} answered ${res.status}: ${text.slice(0, 500)}`);
    return JSON.parse(text) as T;
  }

  /** next-auth credentials flow: csrf token, then the form post; checks that a session came back. */
  async signIn(email: string, password: string): Promise<void> {
    const { csrfToken } = await this.json<{ csrfToken: string }>("/api/auth/csrf");
    const res = await this.fetch("/api/auth/callback/credentials", {
      method: "POST",
      headers: { "content-type": "application/x-www-form-urlencoded" },
      body: new URLSearchParams({ csrfToken, email, password, callbackUrl: this.baseUrl }).toString(),
    });
    await res.arrayBuffer();
    const session = await this.json<{ user?: { email?: string } }>("/api/auth/session");
    if (session.user?.email !== email) throw new Error(`sign-in as ${email} failed (callback answered ${res.status})`);
  }

  /**
   * POSTs a file as the raw request body (streamed from disk, with its length). Returns the parsed
   * answer and when the last byte left (transferEndMs) and the answer arrived (responseMs), both
   * relative to the start.
   */
  uploadFile<T>(
    path: string,
    filePath: string,
  ): Promise<{ status: number; body: T; transferEndMs: number; responseMs: number }> {
    const url = new URL(this.baseUrl + path);
    const size = statSync(filePath).size;
    const start = performance.now();
    return new Promise((resolve, reject) => {
      let transferEndMs = Number.NaN;
      const req = http.request(
        {
          host: url.hostname,
          port: url.port,
          path: url.pathname + url.search,
          method: "POST",
          headers: { cookie: this.cookieHeader(), "content-type": "text/csv", "content-length": size },
        },
        (res) => {
          const chunks: Buffer[] = [];
          res.on("data", (c: Buffer) => chunks.push(c));
          res.on("end", () => {
            const responseMs = performance.now() - start;
            const text = Buffer.concat(chunks).toString("utf8");
            try {
              resolve({
                status: res.statusCode ?? 0,
                body: JSON.parse(text) as T,
                transferEndMs: Number.isNaN(transferEndMs) ? responseMs : transferEndMs,
                responseMs,
              });
            } catch {
              reject(new Error(`upload answered ${res.statusCode}: ${text.slice(0, 500)}`));
            }
          });
          res.on("error", reject);
        },
      );
      req.on("finish", () => (transferEndMs = performance.now() - start));
      req.on("error", reject);
      createReadStream(filePath, { highWaterMark: 1 << 20 })
        .on("error", reject)
        .pipe(req);
    });
  }

  /** POSTs JSON and reads an NDJSON answer line by line, calling `onEvent` with each line's time. */
  async ndjson<E>(path: string, body: unknown, onEvent: (event: E, atMs: number) => void): Promise<void> {
    const start = performance.now();
    const res = await this.fetch(path, {
      method: "POST",
      headers: { "content-type": "application/json" },
      body: JSON.stringify(body),
    });
    if (!res.ok || !res.body)
      throw new Error(`POST ${path} answered ${res.status}: ${(await res.text()).slice(0, 500)}`);
    const decoder = new TextDecoder();
    let pending = "";
    for await (const chunk of res.body as unknown as AsyncIterable<Uint8Array>) {
      pending += decoder.decode(chunk, { stream: true });
      let nl: number;
      while ((nl = pending.indexOf("\n")) >= 0) {
        const line = pending.slice(0, nl);
        pending = pending.slice(nl + 1);
        if (line.trim()) onEvent(JSON.parse(line) as E, performance.now() - start);
      }
    }
    if (pending.trim()) onEvent(JSON.parse(pending) as E, performance.now() - start);
  }
}

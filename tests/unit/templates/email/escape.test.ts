import { describe, expect, it } from "vitest";
import { escapeHtml, oneLine, safeUrl } from "@/templates/email/escape";
import { formatDate, formatDateTime } from "@/lib/format/date";
import { wrapText } from "@/templates/email/wrap-text";

describe("escapeHtml", () => {
  it("escapes the five characters that matter in content and quoted attributes", () => {
    expect(escapeHtml(`<a href="x" title='y'>&</a>`)).toBe(
      "&lt;a href=&quot;x&quot; title=&#39;y&#39;&gt;&amp;&lt;/a&gt;",
    );
  });

  it("escapes an ampersand once, so existing entities show as typed", () => {
    expect(escapeHtml("&lt;")).toBe("&amp;lt;");
  });

  it("leaves other text, accents and dashes alone", () => {
    expect(escapeHtml("Tomás — 1,250.00")).toBe("Tomás — 1,250.00");
  });
});

describe("safeUrl", () => {
  it("accepts absolute http and https links", () => {
    expect(safeUrl("https://sondage.example/engagements/1", "url")).toBe("https://sondage.example/engagements/1");
    expect(safeUrl("http://127.0.0.1:3000/engagements/1", "url")).toBe("http://127.0.0.1:3000/engagements/1");
  });

  it("refuses script and relative links, naming the field", () => {
    expect(() => safeUrl("javascript:alert(1)", "sampleUrl")).toThrow(/sampleUrl: links must use http or https/);
    expect(() => safeUrl("/engagements/1", "sampleUrl")).toThrow(/sampleUrl: not an absolute URL/);
  });
});

describe("oneLine", () => {
  it("folds newlines so user text cannot add a header line", () => {
    expect(oneLine("Sample\r\nBcc: someone@example.com  ")).toBe("Sample Bcc: someone@example.com");
  });
});

describe("dates", () => {
  it("spells out the instant in UTC", () => {
    expect(formatDateTime(new Date("2026-12-02T09:05:00Z"))).toBe("2 Dec 2026, 09:05 UTC");
  });

  it("shows a period end as its calendar day, whatever the time zone", () => {
    expect(formatDate("2026-12-31")).toBe("31 Dec 2026");
  });

  it("refuses what is not a date, naming the field", () => {
    expect(() => formatDateTime("soon", "at")).toThrow(/at: not a date/);
  });
});

describe("wrapText", () => {
  it("wraps at 72 columns and keeps a long link whole", () => {
    const link = `https://sondage.example/${"x".repeat(90)}`;
    const lines = wrapText(`${"word ".repeat(30)}${link}`).split("\n");
    expect(lines.slice(0, -1).every((l) => l.length <= 72)).toBe(true);
    expect(lines.at(-1)).toBe(link);
  });
});

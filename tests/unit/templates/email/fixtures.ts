import type { SampleEventData } from "@/templates/email";

export const HOSTILE = `<script>alert("x")</script> & <img src=x onerror=alert(1)>`;
export const SAMPLE_URL = "https://sondage.example/engagements/12/samples/34";

/** An invented team on an invented client (demo scenario). */
export function sampleEvent(overrides: Partial<SampleEventData> = {}): SampleEventData {
  return {
    recipient: { name: "Priya Nair" },
    actor: { name: "Tomás Reyes" },
    engagement: { clientName: "Tessaly Outdoor", name: "Year-end audit 2026" },
    sample: { name: "Receivables MUS" },
    sampleUrl: SAMPLE_URL,
    at: new Date("2026-12-02T09:05:00Z"),
    ...overrides,
  };
}

/** The href values of every link in an HTML part. */
export function hrefs(html: string): string[] {
  return [...html.matchAll(/href="([^"]*)"/g)].map((m) => m[1]);
}

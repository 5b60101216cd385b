import { readErrorAnswer } from "@/components/ui/api";

export interface Problem { row: number; column: string | null; cell?: string; reason: string }

/** The file types the evidence route accepts (it checks the content, not the name). */
export const EVIDENCE_ACCEPT = ".pdf,.png,.jpg,.jpeg,.gif,.webp,.tif,.tiff,.xlsx,.xls,.docx,.doc,.csv,.txt,.eml,.msg";

/** Posts a file as the raw body with its name in the query; the server's message and problems on failure. */
export async function postFile<T = unknown>(url: string, file: File): Promise<T> {
  const res = await fetch(`${url}${url.includes("?") ? "&" : "?"}fileName=${encodeURIComponent(file.name)}`, { method: "POST", body: file });
  if (!res.ok) {
    const data = await readErrorAnswer(res);
    throw Object.assign(new Error(data.error?.message ?? `Upload failed (${res.status})`), { problems: data.error?.problems as Problem[] | undefined });
  }
  return (await res.json()) as T;
}

import { apiFetch, withFileName } from "@/components/ui/api";

export interface Problem {
  row: number;
  column: string | null;
  cell?: string;
  reason: string;
}

/** The file types the evidence route accepts (it checks the content, not the name). */
export const EVIDENCE_ACCEPT = ".pdf,.png,.jpg,.jpeg,.gif,.webp,.tif,.tiff,.xlsx,.xls,.docx,.doc,.csv,.txt,.eml,.msg";

/** Posts a file as the raw body with its name in the query; on failure an `ApiError` with the server's message and `problems`. */
export async function postFile<T = unknown>(url: string, file: File): Promise<T> {
  return apiFetch<T>(withFileName(url, file), { body: file });
}

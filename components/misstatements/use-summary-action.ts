"use client";
import { useState } from "react";
import { useRouter } from "next/navigation";
import { apiFetch, plainMessage } from "@/components/ui/api";

/** Calls a summary route, then refreshes the server-rendered view; keeps the last message for an Alert. */
export function useSummaryAction(engagementId: number) {
  const router = useRouter();
  const [message, setMessage] = useState<{ tone: "error" | "success"; text: string } | null>(null);
  const [busy, setBusy] = useState(false);
  async function act(
    path: string,
    init: { method?: string; body?: unknown },
    done: string,
    onError?: (err: unknown) => void,
  ): Promise<boolean> {
    setBusy(true);
    setMessage(null);
    try {
      await apiFetch(`/api/engagements/${engagementId}/misstatements${path}`, init);
      setMessage({ tone: "success", text: done });
      router.refresh();
      return true;
    } catch (err) {
      setMessage({ tone: "error", text: plainMessage(err) });
      onError?.(err);
      return false;
    } finally {
      setBusy(false);
    }
  }
  return { act, busy, message, setMessage };
}

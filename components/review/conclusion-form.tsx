"use client";
import { useState } from "react";
import { useRouter } from "next/navigation";
import type { AuditorConclusionRecord } from "@/lib/data/auditor-conclusions";
import type { ComputedResult } from "@/lib/samples/evaluation-types";
import { RESPONSE_KINDS, RESPONSE_LABELS, type ResponseKind } from "@/lib/validation/conclusion";
import { apiFetch, ApiError } from "@/components/ui/api";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { formatMoney } from "@/lib/format/number";
import { formatDateTime } from "@/lib/format/date";
import { Textarea } from "@/components/ui/field";

interface Props {
  base: string;
  computed: ComputedResult;
  complete: boolean;
  conclusion: AuditorConclusionRecord | null;
  mayWrite: boolean;
}

const WITH_AMOUNT: ResponseKind[] = ["ask-client-to-adjust", "conclude-misstated"];
const when = formatDateTime;

/** The auditor's conclusion and response, written by the preparer apart from the result Sondage computes. */
export function ConclusionForm({ base, computed, complete, conclusion, mayWrite }: Props) {
  const router = useRouter();
  const [text, setText] = useState(conclusion?.conclusion ?? "");
  const [chosen, setChosen] = useState<Partial<Record<ResponseKind, { amount: string; note: string }>>>(
    Object.fromEntries(
      (conclusion?.responses ?? []).map((r) => [r.kind, { amount: r.amount ?? "", note: r.note ?? "" }]),
    ),
  );
  const [errors, setErrors] = useState<Record<string, string[]>>({});
  const [message, setMessage] = useState<{ tone: "error" | "success"; text: string } | null>(null);
  const [busy, setBusy] = useState(false);

  async function save(e: React.FormEvent) {
    e.preventDefault();
    setBusy(true);
    setMessage(null);
    setErrors({});
    const responses = RESPONSE_KINDS.filter((k) => chosen[k]).map((k) => ({
      kind: k,
      amount: WITH_AMOUNT.includes(k) ? chosen[k]!.amount : null,
      note: chosen[k]!.note || undefined,
    }));
    try {
      await apiFetch(`${base}/conclusion`, { method: "PUT", body: { conclusion: text, responses } });
      setMessage({
        tone: "success",
        text: "Conclusion recorded. Any later change of results clears it, as it clears sign-offs.",
      });
      router.refresh();
    } catch (err) {
      if (err instanceof ApiError && err.fields) setErrors(err.fields);
      setMessage({ tone: "error", text: (err as Error).message });
    } finally {
      setBusy(false);
    }
  }

  const fieldError = (name: string) => errors[name]?.[0];
  return (
    <section
      aria-labelledby="conclusion-heading"
      className="space-y-3 border-t border-ink-line pt-4"
      data-testid="auditor-conclusion"
    >
      <h3 id="conclusion-heading" className="text-sm font-semibold">
        Auditor&apos;s conclusion and response
      </h3>
      {conclusion && (
        <div className="rounded border border-ink-line p-3 text-sm">
          <p className="text-xs text-ink-faint">
            Written by {conclusion.writtenBy.name} ({conclusion.writtenBy.role}) · {when(conclusion.writtenAt)}
          </p>
          <p className="mt-1 whitespace-pre-line">{conclusion.conclusion}</p>
          {conclusion.responses.length > 0 && (
            <ul className="mt-2 list-disc pl-5">
              {conclusion.responses.map((r) => (
                <li key={r.kind}>
                  {RESPONSE_LABELS[r.kind]}
                  {r.amount !== null && (
                    <>
                      : <span className="figures">{formatMoney(r.amount)}</span>
                    </>
                  )}
                  {r.note && <> — {r.note}</>}
                </li>
              ))}
            </ul>
          )}
        </div>
      )}
      {!complete ? (
        <p className="text-sm text-ink-soft">The preparer records the conclusion once every item has a result.</p>
      ) : (
        mayWrite && (
          <form onSubmit={save} className="space-y-3" noValidate>
            {computed.responseNeeded && (
              <Alert tone="info">
                {computed.supported
                  ? "The limit is close to tolerable"
                  : "The computed result does not support the amount"}
                : record at least one response.
              </Alert>
            )}
            <div>
              <label htmlFor="auditor-conclusion-text" className="block text-sm font-medium">
                Conclusion, in your words
              </label>
              <Textarea
                id="auditor-conclusion-text"
                className="mt-1"
                rows={3}
                value={text}
                onChange={(e) => setText(e.target.value)}
                aria-invalid={Boolean(fieldError("conclusion"))}
                aria-describedby={fieldError("conclusion") ? "auditor-conclusion-error" : undefined}
              />
              {fieldError("conclusion") && (
                <p id="auditor-conclusion-error" className="text-sm text-brick-700" aria-live="polite">
                  {fieldError("conclusion")}
                </p>
              )}
            </div>
            <fieldset className="space-y-2" aria-describedby={fieldError("responses") ? "responses-error" : undefined}>
              <legend className="text-sm font-medium">Response</legend>
              {RESPONSE_KINDS.map((k, i) => (
                <div key={k} className="flex flex-wrap items-center gap-2 text-sm">
                  <label className="flex items-center gap-2">
                    <input
                      type="checkbox"
                      checked={Boolean(chosen[k])}
                      onChange={(e) =>
                        setChosen((c) => ({ ...c, [k]: e.target.checked ? { amount: "", note: "" } : undefined }))
                      }
                    />
                    {RESPONSE_LABELS[k]}
                  </label>
                  {chosen[k] && WITH_AMOUNT.includes(k) && (
                    <input
                      aria-label={`Amount: ${RESPONSE_LABELS[k]}`}
                      inputMode="decimal"
                      className="w-36 rounded border border-ink-line px-2 py-1 text-right figures"
                      value={chosen[k].amount}
                      onChange={(e) => setChosen((c) => ({ ...c, [k]: { ...c[k]!, amount: e.target.value } }))}
                      aria-invalid={Boolean(fieldError(`responses.${i}.amount`))}
                    />
                  )}
                  {chosen[k] && (
                    <input
                      aria-label={`Note: ${RESPONSE_LABELS[k]}`}
                      placeholder="What was or will be done"
                      className="min-w-48 flex-1 rounded border border-ink-line px-2 py-1"
                      value={chosen[k].note}
                      onChange={(e) => setChosen((c) => ({ ...c, [k]: { ...c[k]!, note: e.target.value } }))}
                    />
                  )}
                </div>
              ))}
              {fieldError("responses") && (
                <p id="responses-error" className="text-sm text-brick-700" aria-live="polite">
                  {fieldError("responses")}
                </p>
              )}
            </fieldset>
            {message && <Alert tone={message.tone}>{message.text}</Alert>}
            <Button type="submit" disabled={busy}>
              {conclusion ? "Update the conclusion" : "Record the conclusion"}
            </Button>
          </form>
        )
      )}
    </section>
  );
}

"use client";
import { useState } from "react";
import { useRouter } from "next/navigation";
import { Alert } from "@/components/ui/alert";
import { buttonClass } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { postFile, type Problem } from "@/components/samples/evidence-upload";
import { SAMPLE_CHANGED_EVENT } from "@/components/samples/events";
import { countOf, formatCount } from "@/lib/format/number";

interface Props {
  engagementId: number;
  sampleId: number;
  mayWrite: boolean;
}
interface Imported {
  rows: number;
  changed: number;
  unchanged: number;
}

/** The fieldwork workbook round trip; evidence is attached from each item's row in the grid. */
export function FieldworkFiles({ engagementId, sampleId, mayWrite }: Props) {
  const router = useRouter();
  const base = `/api/engagements/${engagementId}/samples/${sampleId}`;
  const [message, setMessage] = useState<{ tone: "error" | "success"; text: string; problems?: Problem[] } | null>(
    null,
  );

  async function importWorkbook(file: File) {
    setMessage(null);
    try {
      const r = await postFile<Imported>(`${base}/workbook`, file);
      const text =
        r.changed === 0
          ? `Imported ${file.name}: ${countOf(r.rows, "row")} read, nothing had changed.`
          : `Imported ${file.name}: ${countOf(r.changed, "item")} changed, ${formatCount(r.unchanged)} unchanged. Each change is recorded in the audit trail.`;
      setMessage({ tone: "success", text });
      window.dispatchEvent(new Event(SAMPLE_CHANGED_EVENT));
      router.refresh();
    } catch (err) {
      const text = (err as Error).message.trim();
      setMessage({
        tone: "error",
        text: /nothing was (applied|saved|changed)/i.test(text)
          ? text
          : `${text.replace(/\.?$/, ".")} Nothing was applied.`,
        problems: (err as { problems?: Problem[] }).problems,
      });
    }
  }

  const picker = (label: string, accept: string, onFile: (f: File) => void) => (
    <label
      className={buttonClass(
        "secondary",
        "cursor-pointer focus-within:outline-2 focus-within:outline-offset-2 focus-within:outline-ledger-500",
      )}
    >
      {label}
      <input
        type="file"
        accept={accept}
        className="sr-only"
        onChange={(e) => {
          const f = e.target.files?.[0];
          e.target.value = "";
          if (f) onFile(f);
        }}
      />
    </label>
  );

  return (
    <Card title="Fieldwork workbook">
      <div className="space-y-4">
        {message && (
          <Alert tone={message.tone}>
            {message.text}
            {message.problems && (
              <ul className="mt-2 list-disc pl-5">
                {message.problems.slice(0, 50).map((p, i) => (
                  <li key={i}>
                    Row {formatCount(p.row)}
                    {p.column ? `, ${p.column}` : ""}
                    {p.cell ? ` (${p.cell})` : ""}: {p.reason}
                  </li>
                ))}
              </ul>
            )}
          </Alert>
        )}
        <p className="text-sm text-ink-soft">
          Export the selection to Excel, fill in the audited values offline, and import it back. You may sort and filter
          the rows: they are matched by their reference, not their order. An import applies every row or none.
        </p>
        <div className="flex flex-wrap gap-2">
          <a className={buttonClass("secondary")} href={`${base}/workbook`}>
            Export workbook (.xlsx)
          </a>
          {mayWrite && picker("Import filled workbook…", ".xlsx", (f) => void importWorkbook(f))}
        </div>
        <p className="text-xs text-ink-soft">
          Evidence files are attached from each item&apos;s row in the grid (Attach…, or drop a file on the row).
        </p>
      </div>
    </Card>
  );
}

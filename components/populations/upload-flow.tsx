"use client";
import { useState } from "react";
import Link from "next/link";
import { Alert } from "@/components/ui/alert";
import { Amount } from "@/components/ui/amount";
import { Button, buttonClass } from "@/components/ui/button";
import { Field, Select } from "@/components/ui/field";
import { apiFetch } from "@/components/ui/api";
import { DropZone } from "./drop-zone";
import { ProgressBar } from "./progress-bar";
import { LoadProgress } from "./load-progress";
import { LoadProblems } from "./load-problems";
import { MappingForm, type MappingValues, type ReplaceablePopulation } from "./mapping-form";
import { runLoad, type LoadEvent } from "./read-load-stream";
import { uploadLedgerFile, type UploadView } from "./upload-file";
import { FileFacts, InView } from "./file-facts";
import { formatBytes, formatCount } from "@/lib/format/number";

type Stage =
  | { kind: "pick"; refusal?: string }
  | { kind: "uploading"; fileName: string; sent: number; total: number }
  | { kind: "mapping"; upload: UploadView; message?: string }
  | { kind: "loading"; upload: UploadView; progress: Extract<LoadEvent, { type: "progress" }> | null }
  | { kind: "loaded"; upload: UploadView; outcome: Extract<LoadEvent, { type: "loaded" }> }
  | { kind: "rejected"; upload: UploadView; outcome: Extract<LoadEvent, { type: "rejected" }> }
  | { kind: "failed"; upload: UploadView; message: string };

interface Props {
  engagementId: number;
  currency: string;
  replaceable: ReplaceablePopulation[];
}

/** Upload → inspect → map → check and load, each step with its own progress and outcome. */
export function UploadFlow({ engagementId, currency, replaceable }: Props) {
  const [stage, setStage] = useState<Stage>({ kind: "pick" });
  const [sheetBusy, setSheetBusy] = useState(false);
  const base = `/api/engagements/${engagementId}/populations/uploads`;

  const send = async (file: File) => {
    setStage({ kind: "uploading", fileName: file.name, sent: 0, total: file.size });
    try {
      const upload = await uploadLedgerFile(engagementId, file, (sent, total) =>
        setStage({ kind: "uploading", fileName: file.name, sent, total }),
      );
      setStage({ kind: "mapping", upload });
    } catch (err) {
      setStage({ kind: "pick", refusal: `${file.name}: ${err instanceof Error ? err.message : "the upload failed"}` });
    }
  };

  const chooseSheet = async (upload: UploadView, sheet: string) => {
    setSheetBusy(true);
    try {
      const r = await apiFetch<{ upload: UploadView }>(`${base}/${upload.id}?sheet=${encodeURIComponent(sheet)}`);
      setStage({ kind: "mapping", upload: r.upload });
    } catch (err) {
      setStage({ kind: "mapping", upload, message: err instanceof Error ? err.message : "Could not read that sheet" });
    } finally {
      setSheetBusy(false);
    }
  };

  const load = async (upload: UploadView, values: MappingValues) => {
    setStage({ kind: "loading", upload, progress: null });
    const outcome = await runLoad(`${base}/${upload.id}/load`, values, (event) => {
      if (event.type === "progress") setStage({ kind: "loading", upload, progress: event });
    }).catch((err: unknown): LoadEvent => ({
      type: "error",
      status: 0,
      message: err instanceof Error ? err.message : "The load failed",
    }));
    if (outcome.type === "loaded") setStage({ kind: "loaded", upload, outcome });
    else if (outcome.type === "rejected") setStage({ kind: "rejected", upload, outcome });
    else if (outcome.type === "error" && (outcome.status === 400 || outcome.status === 409))
      setStage({ kind: "mapping", upload, message: outcome.message });
    else
      setStage({
        kind: "failed",
        upload,
        message: outcome.type === "error" ? outcome.message : "The load did not finish. Nothing was stored.",
      });
  };

  const again = (
    <Button type="button" variant="secondary" onClick={() => setStage({ kind: "pick" })}>
      Upload a corrected file
    </Button>
  );

  switch (stage.kind) {
    case "pick":
      return (
        <div className="space-y-4">
          {stage.refusal && (
            <Alert>
              <p className="font-semibold">The file was refused; nothing was stored.</p>
              <p className="mt-1">{stage.refusal}</p>
            </Alert>
          )}
          <DropZone onFile={send} />
        </div>
      );
    case "uploading":
      return (
        <ProgressBar
          label={stage.sent >= stage.total ? `Reading ${stage.fileName}…` : `Uploading ${stage.fileName}`}
          value={stage.sent / Math.max(1, stage.total)}
          detail={
            stage.sent >= stage.total
              ? "Received; working out its columns, encoding and formats"
              : `${formatBytes(stage.sent)} of ${formatBytes(stage.total)}`
          }
        />
      );
    case "mapping":
    case "loading": {
      const { upload } = stage;
      const { inspection } = upload;
      return (
        <div className="space-y-5">
          <FileFacts upload={upload} />
          {stage.kind === "mapping" && stage.message && <Alert>{stage.message}</Alert>}
          {stage.kind === "loading" && (
            <InView>
              <div data-testid="load-progress" className="rounded-card border border-ink-line bg-paper p-4">
                <LoadProgress progress={stage.progress} totalBytes={upload.sizeBytes} />
              </div>
            </InView>
          )}
          {inspection.kind === "xlsx" && inspection.sheets && inspection.sheets.length > 1 && (
            <div className="max-w-xs">
              <Field label="Sheet" hint="The rows are read from this sheet only">
                <Select
                  value={inspection.sheet}
                  disabled={sheetBusy || stage.kind === "loading"}
                  onChange={(e) => chooseSheet(upload, e.target.value)}
                >
                  {inspection.sheets.map((s) => (
                    <option key={s} value={s}>
                      {s}
                    </option>
                  ))}
                </Select>
              </Field>
            </div>
          )}
          <MappingForm
            key={`${upload.id}-${inspection.sheet ?? ""}`}
            upload={upload}
            replaceable={replaceable}
            disabled={stage.kind === "loading" || sheetBusy}
            onSubmit={(values) => load(upload, values)}
          />
        </div>
      );
    }
    case "loaded":
      return (
        <div className="space-y-4">
          <Alert tone="success">
            <p className="font-semibold">
              Loaded {formatCount(stage.outcome.rowCount)} items, total{" "}
              <Amount value={stage.outcome.total} currency={currency} />.
            </p>
            <p className="mt-1">
              Next, reconcile it to the trial balance or ledger: an unreconciled population cannot be sampled.
            </p>
          </Alert>
          <div className="flex gap-3">
            <Link
              href={`/engagements/${engagementId}/populations/${stage.outcome.populationId}`}
              className={buttonClass("primary")}
            >
              Open the population and reconcile
            </Link>
            <Link href={`/engagements/${engagementId}`} className={buttonClass("secondary")}>
              Back to the engagement
            </Link>
          </div>
        </div>
      );
    case "rejected":
      return (
        <div className="space-y-4">
          <FileFacts upload={stage.upload} />
          <LoadProblems
            problems={stage.outcome.problems}
            problemCount={stage.outcome.problemCount}
            fileName={stage.upload.fileName}
            downloadHref={`${base}/${stage.upload.id}/problems`}
          />
          {again}
        </div>
      );
    case "failed":
      return (
        <div className="space-y-4">
          <FileFacts upload={stage.upload} />
          <Alert>
            <p className="font-semibold">The file could not be loaded; nothing was stored.</p>
            <p className="mt-1">{stage.message}</p>
          </Alert>
          {again}
        </div>
      );
  }
}

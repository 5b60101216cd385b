"use client";
import { useCallback, useEffect, useState } from "react";
import { useRouter } from "next/navigation";
import { Card } from "@/components/ui/card";
import { Alert } from "@/components/ui/alert";
import { useApi } from "@/components/ui/use-api";
import type { SampleEvaluation, SampleView } from "./types";
import { SampleTabs } from "./sample-tabs";
import { DrawForm } from "./draw-form";
import { DrawFacts, DrawHistory } from "./draw-facts";
import { ReperformPanel } from "./reperform-panel";
import { ExtendForm } from "./extend-form";
import { FieldworkGrid } from "./fieldwork-grid";
import { ProgressStrip } from "./progress-strip";
import { EvaluationPanel } from "./evaluation-panel";
import { EXTENDABLE, REPLACEABLE } from "./labels";
import { HaphazardPicker } from "./haphazard-picker";
import { AnomalyPanel } from "./anomaly-panel";
import { SAMPLE_CHANGED_EVENT } from "./events";
import { UnauditableTreatment } from "./row-treatment";
import type { ItemNoteMark } from "@/components/review/note-labels";

interface Props {
  engagementId: number;
  initialView: SampleView;
  initialEvaluation: SampleEvaluation;
  may: { record: boolean; draw: boolean; acceptAnomaly?: boolean };
  anomaliesAllowed?: boolean;
  planSummary: React.ReactNode;
  /** Review notes raised on items, shown on their rows. */
  notesByItem?: Record<number, ItemNoteMark[]>;
}

/** The sample's three rooms: its plan, its draw, and the results with the live evaluation. */
export function SampleWorkspace({
  engagementId,
  initialView,
  initialEvaluation,
  may,
  anomaliesAllowed = true,
  planSummary,
  notesByItem = {},
}: Props) {
  const router = useRouter();
  const [tab, setTab] = useState(initialView.currentDraw ? "results" : "draw");
  const [changes, setChanges] = useState(0);
  const [gridKey, setGridKey] = useState(0);
  const base = `/api/engagements/${engagementId}/samples/${initialView.sample.id}`;
  const viewRead = useApi<SampleView>(base, { initial: initialView });
  const view = viewRead.data ?? initialView;
  const { sample, currentDraw, draws, population } = view;
  // Every change of results bumps `changes`; only the latest evaluation asked for is shown.
  const evaluationRead = useApi<{ evaluation: SampleEvaluation }>(`${base}/evaluation`, {
    initial: { evaluation: initialEvaluation },
    revision: changes,
  });
  const evaluation = evaluationRead.data?.evaluation ?? initialEvaluation;
  const evaluating = evaluationRead.isValidating;
  const evalFailure = evaluationRead.error?.message ?? null;

  const changed = useCallback(() => setChanges((n) => n + 1), []);
  const { reload: reloadView, mutate: setView } = viewRead;
  const refreshView = useCallback(async () => {
    await reloadView();
  }, [reloadView]);
  // The review panel (server-rendered) offers the conclusion and sign-off once every item has a result: re-render it when that flips.
  const completeOnServer = initialEvaluation.complete;
  useEffect(() => {
    if (evaluation.complete !== completeOnServer) router.refresh();
  }, [evaluation.complete, completeOnServer, router]);
  // A workbook import elsewhere on the page changed the results: refetch the grid, progress and evaluation.
  useEffect(() => {
    const onChange = () => {
      setGridKey((k) => k + 1);
      changed();
      void refreshView().catch(() => undefined);
    };
    window.addEventListener(SAMPLE_CHANGED_EVENT, onChange);
    return () => window.removeEventListener(SAMPLE_CHANGED_EVENT, onChange);
  }, [changed, refreshView]);
  const onDrawn = (next: SampleView) => {
    void setView(next, { revalidate: false });
    setGridKey((k) => k + 1);
    changed();
    setTab(next.currentDraw?.seedSource === "haphazard" ? "draw" : "results");
    router.refresh();
  };
  const attribute = sample.method === "attribute";

  const tabs = [
    { id: "plan", label: "Plan" },
    {
      id: "draw",
      label: "Draw",
      badge: currentDraw ? <span className="figures text-xs text-ink-faint">v{currentDraw.version}</span> : undefined,
    },
    {
      id: "results",
      label: "Results and evaluation",
      badge: currentDraw ? (
        <span className="figures text-xs text-ink-faint">
          {evaluation.progress.done + evaluation.progress.notAuditable}/{evaluation.progress.total}
        </span>
      ) : undefined,
    },
  ];
  return (
    <>
      <SampleTabs tabs={tabs} current={tab} onChange={setTab} />
      <div role="tabpanel" id="panel-plan" hidden={tab !== "plan"}>
        <Card>{planSummary}</Card>
      </div>
      <div role="tabpanel" id="panel-draw" hidden={tab !== "draw"} className="space-y-6">
        <div className="grid gap-6 lg:grid-cols-2">
          <Card title={currentDraw ? `Current draw — version ${currentDraw.version}` : "Not drawn yet"}>
            {currentDraw ? (
              <DrawFacts draw={currentDraw} itemCount={evaluation.progress.total + evaluation.progress.void} />
            ) : (
              <p className="text-sm text-ink-soft">
                The server draws the sample from the population as loaded, with a recorded seed, so anyone can redo it.
              </p>
            )}
          </Card>
          <Card title={currentDraw ? "Re-perform or draw again" : "Draw the sample"}>
            <div className="space-y-5">
              {currentDraw && (
                <ReperformPanel engagementId={engagementId} sampleId={sample.id} onChecked={refreshView} />
              )}
              {may.draw ? (
                <DrawForm
                  engagementId={engagementId}
                  sampleId={sample.id}
                  currentVersion={currentDraw?.version ?? null}
                  populationReady={population.status === "reconciled"}
                  onDrawn={onDrawn}
                  seeded={
                    !(sample.method === "nonstatistical" && sample.plan.nonstatistical?.selection === "haphazard")
                  }
                />
              ) : (
                !currentDraw && (
                  <Alert tone="info">A senior, manager or partner on the engagement draws the sample.</Alert>
                )
              )}
            </div>
          </Card>
        </div>
        {currentDraw?.seedSource === "haphazard" && (
          <Card title="Pick the items (haphazard selection)">
            <HaphazardPicker
              engagementId={engagementId}
              sampleId={sample.id}
              populationId={population.id}
              planned={sample.plan.chosenSize}
              mayPick={may.draw}
              hasDescription={Boolean(population.mapping.descriptionColumn)}
              onChanged={() => {
                setGridKey((k) => k + 1);
                changed();
              }}
            />
          </Card>
        )}
        {draws.length > 0 && (
          <Card title="Draw history">
            <DrawHistory draws={draws} />
          </Card>
        )}
        {currentDraw && may.draw && EXTENDABLE.includes(sample.method) && (
          <Card title="Extend the sample">
            <ExtendForm
              engagementId={engagementId}
              sampleId={sample.id}
              onExtended={() => {
                setGridKey((k) => k + 1);
                changed();
              }}
            />
          </Card>
        )}
      </div>
      <div role="tabpanel" id="panel-results" hidden={tab !== "results"} className="space-y-6">
        {!currentDraw ? (
          <Alert tone="info">Draw the sample first; its items will be listed here for results.</Alert>
        ) : (
          <>
            <Card title="Progress">
              <ProgressStrip progress={evaluation.progress} attribute={attribute} />
            </Card>
            <Card title="Items and results">
              <UnauditableTreatment.Provider
                value={{ unauditableOnRow: evaluation.unauditableOnRow, direction: evaluation.direction }}
              >
                <FieldworkGrid
                  engagementId={engagementId}
                  sampleId={sample.id}
                  method={sample.method}
                  drawVersion={currentDraw.version}
                  mayRecord={may.record}
                  mayReplace={may.draw && REPLACEABLE.includes(sample.method)}
                  refreshKey={gridKey}
                  onSaved={changed}
                  notesByItem={notesByItem}
                />
              </UnauditableTreatment.Provider>
            </Card>
            {sample.method !== "attribute" && evaluation.progress.misstatements > 0 && (
              <Card title="Anomalous misstatements">
                <AnomalyPanel
                  base={base}
                  method={sample.method}
                  refreshKey={changes}
                  mayMark={may.record}
                  mayAccept={Boolean(may.acceptAnomaly)}
                  allowed={anomaliesAllowed}
                  onChanged={changed}
                />
              </Card>
            )}
            <Card title="Evaluation">
              {evalFailure && (
                <div className="mb-3">
                  <Alert>{evalFailure}</Alert>
                </div>
              )}
              <EvaluationPanel evaluation={evaluation} direction={sample.direction} loading={evaluating} />
            </Card>
          </>
        )}
      </div>
    </>
  );
}

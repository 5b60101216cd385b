/** The whole workpaper as a @react-pdf/renderer document. */
import type { ReactNode } from "react";
import { Document, Page, View } from "@react-pdf/renderer";
import { AuditTrailAppendix } from "./audit-trail-appendix";
import { EvidenceIndexSection } from "./evidence-index-section";
import { ConclusionSection } from "./conclusion-section";
import { EvaluationSection } from "./evaluation-section";
import { ObjectiveSection } from "./objective-section";
import { DraftWatermark, Footer, RunningHeader } from "./page-frame";
import { PlanSection } from "./plan-section";
import { PopulationSection } from "./population-section";
import { paginateItems } from "./results-pages";
import { ResultsSection } from "./results-section";
import { ReviewNotesSection } from "./review-notes-section";
import { SelectionSection } from "./selection-section";
import { KeyItemsAndPicks } from "./key-items-section";
import { SignOffsSection } from "./sign-offs-section";
import { s } from "./styles";
import { TitleBlock } from "./title-block";
import type { WorkpaperData } from "./workpaper-data";

/**
 * One run of pages with the running header, footer and (in a draft) the watermark. Each part of the
 * workpaper that starts on a new page is its own <Page>: pagination stays local to that part, which
 * keeps long result tables fast to lay out.
 */
function Sheet({ data, children }: { data: WorkpaperData; children: ReactNode }) {
  return (
    <Page size="A4" style={s.page} wrap>
      {data.draft && <DraftWatermark />}
      <RunningHeader data={data} />
      <View style={s.body}>{children}</View>
      <Footer data={data} />
    </Page>
  );
}

export function WorkpaperDocument({ data }: { data: WorkpaperData }) {
  const runs = paginateItems(data.items);
  return (
    <Document
      title={`${data.workpaperReference} — ${data.sampleName}${data.draft ? " (draft)" : ""}`}
      author={data.firmName}
      subject={`${data.clientName} · ${data.engagementName}`}
      creator="Sondage"
      producer="Sondage"
      language="en"
    >
      <Sheet data={data}>
        <TitleBlock data={data} />
        <ObjectiveSection data={data} />
        <PopulationSection data={data} />
        <PlanSection data={data} />
        <SelectionSection data={data} />
        <KeyItemsAndPicks data={data} />
      </Sheet>
      {runs.map((items, i) => (
        <Sheet key={`results-${i}`} data={data}>
          <ResultsSection data={data} items={items} first={i === 0} last={i === runs.length - 1} />
        </Sheet>
      ))}
      <Sheet data={data}>
        <EvaluationSection data={data} />
        <ConclusionSection data={data} />
        <ReviewNotesSection data={data} />
        <SignOffsSection data={data} />
      </Sheet>
      <Sheet data={data}>
        <AuditTrailAppendix data={data} />
        <EvidenceIndexSection data={data} />
      </Sheet>
    </Document>
  );
}

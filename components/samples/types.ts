import type { loadSampleView } from "@/lib/samples/context";
import type { SampleEvaluation } from "@/lib/samples/evaluate";
import type { ReperformResult } from "@/lib/samples/reperform";

/** GET /api/engagements/:id/samples/:sampleId — the sample, its population, draws and engagement. */
export type SampleView = Awaited<ReturnType<typeof loadSampleView>>;
export type { SampleEvaluation, ReperformResult };

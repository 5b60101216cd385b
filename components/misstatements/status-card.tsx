import type { SummaryView } from "@/lib/misstatements/types";
import { Badge } from "@/components/ui/badge";
import { Card } from "@/components/ui/card";

const TONE = {
  "well-within": "green",
  approaching: "amber",
  "exceeds-performance": "red",
  "exceeds-overall": "red",
} as const;

/** The plain-words status, and when approaching or over, the responses the standards expect. */
export function StatusCard({ view }: { view: SummaryView }) {
  const st = view.status;
  return (
    <Card title="Status" action={<Badge tone={TONE[st.level]}>{st.label}</Badge>}>
      <div className="space-y-3 text-sm" data-testid="summary-status" data-level={st.level}>
        <p className="font-medium" aria-live="polite">
          {st.words}
        </p>
        <p className="text-ink-soft">
          Approaching means above {Math.round(st.approachingShare * 10000) / 100} % of performance materiality (
          {st.approachingShareSource}).
        </p>
        {st.allowanceWarning && (
          <p className="rounded-md border border-amber-100 bg-amber-50 px-3 py-2 text-amber-700">
            {st.allowanceWarning}
          </p>
        )}
        {st.responses.length > 0 && (
          <div>
            <h3 className="font-semibold">What the standards expect now</h3>
            <ul className="mt-1 list-disc space-y-1 pl-5 text-ink-soft">
              {st.responses.map((r) => (
                <li key={r}>{r}</li>
              ))}
            </ul>
          </div>
        )}
        <p className="text-xs text-ink-faint">{view.caution}</p>
      </div>
    </Card>
  );
}

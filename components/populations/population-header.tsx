import Link from "next/link";
import type { PopulationRecord } from "@/lib/data/populations";
import { Badge } from "@/components/ui/badge";
import { buttonClass } from "@/components/ui/button";
import { CopyButton } from "./copy-button";
import { POPULATION_STATUS_LABELS, populationStatusTone } from "./labels";
import { formatBytes, formatCount } from "@/lib/format/number";
import { formatDateTime } from "@/lib/format/date";

interface Props {
  population: PopulationRecord;
  engagement: { id: number; name: string; clientName: string };
  replacedBy: { id: number; name: string } | null;
  replaces: { id: number; name: string } | null;
}

/** Name, state and the source file's identity (name, size, SHA-256, the original for download). */
export function PopulationHeader({ population: p, engagement, replacedBy, replaces }: Props) {
  return (
    <div className="mb-6 space-y-4 border-b border-ink-line pb-5">
      <div className="flex flex-wrap items-end justify-between gap-4">
        <div>
          <p className="text-xs font-semibold uppercase tracking-[0.14em] text-ledger-600">
            <Link href={`/engagements/${engagement.id}`} className="link">
              {engagement.clientName} · {engagement.name}
            </Link>
          </p>
          <h1 className="mt-1 flex flex-wrap items-center gap-3 text-2xl font-semibold">
            {p.name} <Badge tone={populationStatusTone(p.status)}>{POPULATION_STATUS_LABELS[p.status]}</Badge>
          </h1>
          <p className="mt-1 text-sm text-ink-soft">
            Loaded by {p.createdByName} on {formatDateTime(p.createdAt)}
          </p>
        </div>
        <a
          href={`/api/engagements/${engagement.id}/populations/${p.id}/original`}
          className={buttonClass("secondary")}
          download
        >
          Download the original file
        </a>
      </div>
      <dl className="grid gap-x-8 gap-y-2 text-sm sm:grid-cols-[auto_1fr]">
        <dt className="text-ink-soft">Source file</dt>
        <dd className="font-medium">
          {p.sourceFileName}{" "}
          <span className="font-normal text-ink-soft">
            · {formatBytes(p.sourceSizeBytes)} ({formatCount(p.sourceSizeBytes)} bytes)
          </span>
        </dd>
        <dt className="text-ink-soft">SHA-256</dt>
        <dd className="flex min-w-0 items-center gap-2">
          <code className="figures break-all text-xs text-ink" data-testid="source-sha256">
            {p.sourceSha256}
          </code>
          <CopyButton text={p.sourceSha256} label="Copy the SHA-256" />
        </dd>
        {replaces && (
          <>
            <dt className="text-ink-soft">Replaces</dt>
            <dd>
              <Link className="text-ledger-600 link" href={`/engagements/${engagement.id}/populations/${replaces.id}`}>
                {replaces.name}
              </Link>
            </dd>
          </>
        )}
        {replacedBy && (
          <>
            <dt className="text-ink-soft">Superseded by</dt>
            <dd>
              <Link
                className="text-ledger-600 link"
                href={`/engagements/${engagement.id}/populations/${replacedBy.id}`}
              >
                {replacedBy.name}
              </Link>
            </dd>
          </>
        )}
      </dl>
    </div>
  );
}

import Link from "next/link";
import { formatDateTime } from "@/lib/format/date";

interface Props {
  engagementId: number;
  population: { id: number; name: string };
  replacement: { id: number; name: string; createdAt: string; createdByName: string } | null;
}

/** On a sample whose population was replaced by a corrected file: what that means and what to do. */
export function SupersededBanner({ engagementId, population, replacement }: Props) {
  return (
    <div
      role="status"
      className="mb-6 space-y-1 rounded-md border border-amber-100 bg-amber-50 px-4 py-3 text-sm text-amber-700"
      data-testid="superseded-banner"
    >
      <p className="font-semibold">The population of this sample was superseded.</p>
      <p>
        &ldquo;
        <Link className="link" href={`/engagements/${engagementId}/populations/${population.id}`}>
          {population.name}
        </Link>
        &rdquo; was replaced
        {replacement ? (
          <>
            {" "}
            by &ldquo;
            <Link className="link" href={`/engagements/${engagementId}/populations/${replacement.id}`}>
              {replacement.name}
            </Link>
            &rdquo; ({replacement.createdByName}, {formatDateTime(replacement.createdAt)})
          </>
        ) : null}{" "}
        with a corrected file. This sample&apos;s items were drawn from the old file and its evaluation still projects
        onto the old book value, so its result may not describe the corrected ledger.
      </p>
      <p>
        Compare the two populations. If the correction does not touch what this sample tests, record why in a review
        note; otherwise plan a new sample from the corrected population and explain the change in the workpaper.
      </p>
    </div>
  );
}

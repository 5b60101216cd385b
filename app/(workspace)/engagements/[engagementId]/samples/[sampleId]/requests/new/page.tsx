import type { Metadata } from "next";
import Link from "next/link";
import { requireEngagementPage } from "@/lib/auth/page-guards";
import { hasAtLeastRole } from "@/lib/auth/roles";
import { PageHeader } from "@/components/ui/page-header";
import { Alert } from "@/components/ui/alert";
import { RequestListForm } from "@/components/requests/request-list-form";
import { loadNewRequestListPage } from "@/lib/views/sample-page";

export const metadata: Metadata = { title: "Ask the client for evidence" };

export default async function NewRequestListPage({
  params,
}: {
  params: Promise<{ engagementId: string; sampleId: string }>;
}) {
  const { engagementId, sampleId } = await params;
  const { engagement, role } = await requireEngagementPage(engagementId);
  const { view, items, contacts } = await loadNewRequestListPage(engagement.id, sampleId);
  const back = `/engagements/${engagement.id}/samples/${view.sample.id}`;
  const blocked = !hasAtLeastRole(role, "senior")
    ? "A senior, manager or partner on the engagement sends request lists to the client."
    : view.review.lock
      ? "The sample is locked: its workpaper is final, so nothing more is asked of the client."
      : !view.currentDraw
        ? "Draw the sample first: requests are for its selected items."
        : null;
  const defaultDue = dateInTwoWeeks();
  return (
    <>
      <PageHeader eyebrow={engagement.clientName} title="Ask the client for evidence">
        <Link href={back} className="link">
          {view.sample.name}
        </Link>{" "}
        · the client contact sees only this list&rsquo;s items, never results, comments or other samples.
      </PageHeader>
      {blocked ? (
        <Alert tone="info">{blocked}</Alert>
      ) : (
        <RequestListForm
          engagementId={engagement.id}
          sampleId={view.sample.id}
          contacts={contacts}
          defaultDue={defaultDue}
          items={items
            .filter((i) => i.status !== "void")
            .map((i) => ({ id: i.id, itemRef: i.itemRef, description: i.description, bookValue: i.bookValue }))}
        />
      )}
    </>
  );
}

/** The due date offered for a new request list: two weeks from today (common practice). */
function dateInTwoWeeks(): string {
  return new Date(Date.now() + 14 * 86400_000).toISOString().slice(0, 10);
}

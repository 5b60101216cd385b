import type { Metadata } from "next";
import { requireWorkspaceUser } from "@/lib/auth/page-guards";
import { loadInboxPage } from "@/lib/views/workspace-pages";
import { PageHeader } from "@/components/ui/page-header";
import { InboxList } from "@/components/review/inbox-list";

export const metadata: Metadata = { title: "Inbox" };

export default async function InboxPage() {
  const user = await requireWorkspaceUser();
  const inbox = await loadInboxPage(user.id);
  return (
    <>
      <PageHeader eyebrow="Workspace" title="Inbox">
        Samples waiting for you, across your engagements: a sign-off to review, a reviewed sample to lock, review notes
        to answer or to clear. Oldest first.
      </PageHeader>
      <InboxList inbox={inbox} />
    </>
  );
}

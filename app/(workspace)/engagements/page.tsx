import type { Metadata } from "next";
import Link from "next/link";
import { requireWorkspaceUser } from "@/lib/auth/page-guards";
import { gradeMayCreateEngagement } from "@/lib/auth/roles";
import { PageHeader } from "@/components/ui/page-header";
import { buttonClass } from "@/components/ui/button";
import { EngagementList } from "@/components/engagements/engagement-list";

export const metadata: Metadata = { title: "Engagements" };

export default async function EngagementsPage() {
  const user = await requireWorkspaceUser();
  return (
    <>
      <PageHeader
        eyebrow="Workspace"
        title="Engagements"
        actions={
          gradeMayCreateEngagement(user.grade) ? (
            <Link href="/engagements/new" className={buttonClass()}>
              New engagement
            </Link>
          ) : undefined
        }
      >
        The audits you are on. Only engagements whose team includes you are listed.
      </PageHeader>
      <EngagementList />
    </>
  );
}

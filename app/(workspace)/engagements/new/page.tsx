import type { Metadata } from "next";
import { requireWorkspaceUser } from "@/lib/auth/page-guards";
import { gradeMayCreateEngagement } from "@/lib/auth/roles";
import { PageHeader } from "@/components/ui/page-header";
import { Alert } from "@/components/ui/alert";
import { Card } from "@/components/ui/card";
import { EngagementForm } from "@/components/engagements/engagement-form";

export const metadata: Metadata = { title: "New engagement" };

export default async function NewEngagementPage() {
  const user = await requireWorkspaceUser();
  return (
    <>
      <PageHeader eyebrow="Engagements" title="New engagement">
        You join the team as its {user.grade === "partner" ? "partner" : "manager"}; add the rest of the team next.
      </PageHeader>
      {gradeMayCreateEngagement(user.grade) ? (
        <Card>
          <EngagementForm />
        </Card>
      ) : (
        <Alert>Only managers and partners can create engagements. Ask a manager on your team to set it up.</Alert>
      )}
    </>
  );
}

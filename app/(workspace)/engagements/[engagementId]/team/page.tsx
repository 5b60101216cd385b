import type { Metadata } from "next";
import Link from "next/link";
import { requireEngagementPage } from "@/lib/auth/page-guards";
import { loadTeamPage } from "@/lib/views/engagement-pages";
import { PageHeader } from "@/components/ui/page-header";
import { Card } from "@/components/ui/card";
import { TeamManager } from "@/components/engagements/team-manager";
import { EngagementTabs } from "@/components/engagements/engagement-tabs";

export const metadata: Metadata = { title: "Team" };

export default async function TeamPage({ params }: { params: Promise<{ engagementId: string }> }) {
  const { engagementId } = await params;
  const { engagement, role, user } = await requireEngagementPage(engagementId);
  const members = await loadTeamPage(engagement.id);
  return (
    <>
      <PageHeader eyebrow={engagement.clientName} title="Team">
        <Link href={`/engagements/${engagement.id}`} className="link">
          {engagement.name}
        </Link>{" "}
        · managers and partners change the team; no one can give a role above their own.
      </PageHeader>
      <EngagementTabs engagementId={engagement.id} current="team" />
      <Card>
        <TeamManager engagementId={engagement.id} myRole={role} myUserId={user.id} initialMembers={members} />
      </Card>
    </>
  );
}

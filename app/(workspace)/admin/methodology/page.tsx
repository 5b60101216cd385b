import type { Metadata } from "next";
import { requireAdminPage } from "@/lib/auth/admin-guard";
import { loadMethodologyPage } from "@/lib/views/workspace-pages";
import { PageHeader } from "@/components/ui/page-header";
import { MethodologyForm } from "@/components/admin/methodology-form";
import { MethodologyHistory } from "@/components/admin/methodology-history";

export const metadata: Metadata = { title: "Methodology settings" };

export default async function MethodologyPage() {
  const admin = await requireAdminPage();
  const { current, changes } = await loadMethodologyPage(admin.firmId);
  return (
    <>
      <PageHeader eyebrow="Firm administration" title="Methodology settings">
        The firm&rsquo;s sampling methodology: the assurance-factor table that maps the assessed risks to a factor and a
        confidence, and the rules the engine follows. Each save is a new version; a plan keeps the version stamped on it
        when it was saved, so a later change never alters an existing plan or workpaper.
      </PageHeader>
      <div className="space-y-6">
        <MethodologyForm initial={current} />
        <MethodologyHistory changes={changes} />
      </div>
    </>
  );
}

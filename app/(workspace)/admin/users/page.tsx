import type { Metadata } from "next";
import Link from "next/link";
import { getDb } from "@/db/knex";
import { requireAdminPage } from "@/lib/auth/admin-guard";
import { listUsersByFirmId } from "@/lib/data/users";
import { PageHeader } from "@/components/ui/page-header";
import { buttonClass } from "@/components/ui/button";
import { UserAdmin } from "@/components/admin/user-admin";

export const metadata: Metadata = { title: "People" };

export default async function UsersPage() {
  const admin = await requireAdminPage();
  const users = await listUsersByFirmId(getDb(), { firmId: admin.firmId });
  return (
    <>
      <PageHeader eyebrow="Firm administration" title="People" actions={<Link href="/admin/users/new" className={buttonClass()}>New user</Link>}>
        Everyone who can sign in to your firm&rsquo;s workspace. Deactivated people cannot sign in; their work stays on record.
      </PageHeader>
      <UserAdmin initialUsers={users} myUserId={admin.id} />
    </>
  );
}

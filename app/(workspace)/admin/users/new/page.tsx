import type { Metadata } from "next";
import { requireAdminPage } from "@/lib/auth/admin-guard";
import { PageHeader } from "@/components/ui/page-header";
import { Card } from "@/components/ui/card";
import { CreateUserForm } from "@/components/admin/create-user-form";

export const metadata: Metadata = { title: "New user" };

export default async function NewUserPage() {
  await requireAdminPage();
  return (
    <>
      <PageHeader eyebrow="Firm administration" title="New user" />
      <Card>
        <CreateUserForm />
      </Card>
    </>
  );
}

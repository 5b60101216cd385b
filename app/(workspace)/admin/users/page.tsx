import type { Metadata } from "next";
import Link from "next/link";
import { requireAdminPage } from "@/lib/auth/admin-guard";
import { loadUsersPage } from "@/lib/views/workspace-pages";
import { PageHeader } from "@/components/ui/page-header";
import { buttonClass } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { Alert } from "@/components/ui/alert";
import { UserAdmin } from "@/components/admin/user-admin";
import { Table, THead, Th, Td } from "@/components/ui/table";

export const metadata: Metadata = { title: "People" };

export default async function UsersPage({
  searchParams,
}: {
  searchParams: Promise<{ invited?: string; mail?: string }>;
}) {
  const [admin, { invited, mail }] = await Promise.all([requireAdminPage(), searchParams]);
  const users = await loadUsersPage(admin.firmId);
  const contacts = users.filter((u) => u.grade === "client");
  return (
    <>
      <PageHeader
        eyebrow="Firm administration"
        title="People"
        actions={
          <Link href="/admin/users/new" className={buttonClass()}>
            New user
          </Link>
        }
      >
        Everyone who can sign in to your firm&rsquo;s workspace. Deactivated people cannot sign in; their work stays on
        record.
      </PageHeader>
      {invited && (
        <div className="mb-4">
          <Alert tone={mail === "failed" ? "error" : "success"}>
            {mail === "failed"
              ? `${invited} was added, but the invitation e-mail could not be sent. Use "Reset password" to send a new link once mail works.`
              : `${invited} was added and e-mailed a link to choose a password (valid once, for 14 days).`}
          </Alert>
        </div>
      )}
      <UserAdmin initialUsers={users.filter((u) => u.grade !== "client")} myUserId={admin.id} />
      {contacts.length > 0 && (
        <div className="mt-8">
          <Card title="Client contacts">
            <p className="mb-3 text-sm text-ink-soft">
              Client staff invited to share evidence on an engagement. They are not members of the firm: they see only
              the request lists sent to them.
            </p>
            <Table label="Client contacts" density="list">
              <THead>
                <tr>
                  <Th>Name</Th>
                  <Th>E-mail</Th>
                  <Th>Status</Th>
                </tr>
              </THead>
              <tbody>
                {contacts.map((c) => (
                  <tr key={c.id} className="border-t border-ink-line/70">
                    <Td>{c.name}</Td>
                    <Td>{c.email}</Td>
                    <Td>{c.active ? "Active" : "Deactivated"}</Td>
                  </tr>
                ))}
              </tbody>
            </Table>
          </Card>
        </div>
      )}
    </>
  );
}

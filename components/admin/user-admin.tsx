"use client";
import { useState } from "react";
import type { ColumnDef } from "@tanstack/react-table";
import type { UserRecord } from "@/lib/data/users";
import { DataTable } from "@/components/ui/data-table";
import { EmptyState } from "@/components/ui/card";
import { Badge } from "@/components/ui/badge";
import { Button } from "@/components/ui/button";
import { Alert } from "@/components/ui/alert";
import { apiFetch } from "@/components/ui/api";
import { GRADE_LABELS } from "@/lib/auth/roles";

export function UserAdmin({ initialUsers, myUserId }: { initialUsers: UserRecord[]; myUserId: number }) {
  const [users, setUsers] = useState(initialUsers);
  const [message, setMessage] = useState<{ tone: "error" | "success"; text: string } | null>(null);

  async function setActive(user: UserRecord, active: boolean) {
    setMessage(null);
    try {
      const { user: updated } = await apiFetch<{ user: UserRecord }>(`/api/users/${user.id}`, {
        method: "PATCH",
        body: { active },
      });
      setUsers((list) => list.map((u) => (u.id === updated.id ? updated : u)));
      setMessage({
        tone: "success",
        text: `${user.name} is ${active ? "active again" : "deactivated and can no longer sign in"}.`,
      });
    } catch (err) {
      setMessage({ tone: "error", text: (err as Error).message });
    }
  }

  async function resetPassword(user: UserRecord) {
    if (
      !window.confirm(
        `Reset ${user.name}'s password? Their current password stops working at once, their open sessions end, and they are e-mailed a link to choose a new one.`,
      )
    )
      return;
    setMessage(null);
    try {
      const { invitationSent } = await apiFetch<{ invitationSent: boolean }>(`/api/users/${user.id}/password`, {
        body: {},
      });
      setMessage(
        invitationSent
          ? {
              tone: "success",
              text: `${user.name}'s password no longer works and their sessions have ended. They were e-mailed a link to choose a new one (valid once, for 14 days).`,
            }
          : {
              tone: "error",
              text: `${user.name}'s password no longer works, but the e-mail with the link could not be sent. Try "Reset password" again once mail works.`,
            },
      );
    } catch (err) {
      setMessage({ tone: "error", text: (err as Error).message });
    }
  }

  const columns: ColumnDef<UserRecord, unknown>[] = [
    {
      accessorKey: "name",
      header: "Name",
      cell: ({ row }) => <span className="font-medium">{row.original.name}</span>,
    },
    { accessorKey: "email", header: "E-mail" },
    { accessorKey: "grade", header: "Grade", cell: ({ row }) => GRADE_LABELS[row.original.grade] },
    {
      accessorKey: "firmRole",
      header: "Firm role",
      cell: ({ getValue }) => (getValue() === "admin" ? <Badge tone="blue">Admin</Badge> : "Member"),
    },
    {
      accessorKey: "active",
      header: "Status",
      cell: ({ getValue }) => (getValue() ? <Badge tone="green">Active</Badge> : <Badge tone="red">Deactivated</Badge>),
    },
    {
      id: "actions",
      header: "",
      enableSorting: false,
      cell: ({ row }) =>
        row.original.id === myUserId ? null : (
          <div className="flex justify-end gap-1">
            <Button variant="ghost" onClick={() => resetPassword(row.original)}>
              Reset password
            </Button>
            {row.original.active ? (
              <Button variant="ghost" onClick={() => setActive(row.original, false)}>
                Deactivate
              </Button>
            ) : (
              <Button variant="ghost" onClick={() => setActive(row.original, true)}>
                Reactivate
              </Button>
            )}
          </div>
        ),
    },
  ];

  return (
    <div className="space-y-4">
      {message && <Alert tone={message.tone}>{message.text}</Alert>}
      <DataTable
        data={users}
        columns={columns}
        label="People"
        filterPlaceholder="Filter by name, e-mail, grade…"
        empty={<EmptyState title="No people yet" />}
      />
    </div>
  );
}

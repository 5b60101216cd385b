"use client";
import { useState } from "react";
import {
  ENGAGEMENT_ROLES,
  ROLE_LABELS,
  defaultRoleForGrade,
  hasAtLeastRole,
  type EngagementRole,
} from "@/lib/auth/roles";
import type { MemberRecord } from "@/lib/data/members";
import type { UserRecord } from "@/lib/data/users";
import { apiFetch } from "@/components/ui/api";
import { useApi } from "@/components/ui/use-api";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Select } from "@/components/ui/field";
import { Table, THead, Th, Td } from "@/components/ui/table";

interface Props {
  engagementId: number;
  myRole: EngagementRole;
  myUserId: number;
  initialMembers: MemberRecord[];
}

export function TeamManager({ engagementId, myRole, myUserId, initialMembers }: Props) {
  const [members, setMembers] = useState(initialMembers);
  const [message, setMessage] = useState<{ tone: "error" | "success"; text: string } | null>(null);
  const [candidate, setCandidate] = useState("");
  const canManage = hasAtLeastRole(myRole, "manager");
  const grantable = ENGAGEMENT_ROLES.filter((r) => hasAtLeastRole(myRole, r));
  const base = `/api/engagements/${engagementId}/members`;

  const { data: firm } = useApi<{ users: UserRecord[] }>(canManage ? "/api/users" : null);
  const people = firm?.users.filter((u) => u.active) ?? [];

  async function run(action: () => Promise<{ members: MemberRecord[] }>, done: string) {
    setMessage(null);
    try {
      setMembers((await action()).members);
      setMessage({ tone: "success", text: done });
    } catch (err) {
      setMessage({ tone: "error", text: err instanceof Error ? err.message : "The change was not saved" });
    }
  }

  // Client staff are invited as client contacts from a sample's client requests, never onto the team.
  const outside = people.filter((p) => p.grade !== "client" && !members.some((m) => m.userId === p.id));
  const chosen = outside.find((p) => String(p.id) === candidate);

  return (
    <div className="space-y-4">
      {message && <Alert tone={message.tone}>{message.text}</Alert>}
      <Table label="Team" density="list">
        <THead>
          <tr>
            <Th>Name</Th>
            <Th>E-mail</Th>
            <Th>Role</Th>
            <Th className="sr-only">Actions</Th>
          </tr>
        </THead>
        <tbody>
          {members.map((m) => {
            const editable = canManage && hasAtLeastRole(myRole, m.role);
            return (
              <tr key={m.userId} className="border-t border-ink-line/70">
                <Td className="font-medium">
                  {m.name}
                  {m.userId === myUserId && <span className="ml-2 text-xs text-ink-faint">(you)</span>}
                </Td>
                <Td className="text-ink-soft">{m.email}</Td>
                <Td className="w-44">
                  {editable ? (
                    <Select
                      aria-label={`Role of ${m.name}`}
                      value={m.role}
                      onChange={(e) =>
                        run(
                          () => apiFetch(`${base}/${m.userId}`, { method: "PATCH", body: { role: e.target.value } }),
                          `${m.name} is now ${e.target.value}.`,
                        )
                      }
                    >
                      {grantable.map((r) => (
                        <option key={r} value={r}>
                          {ROLE_LABELS[r]}
                        </option>
                      ))}
                    </Select>
                  ) : (
                    ROLE_LABELS[m.role]
                  )}
                </Td>
                <Td className="w-28 text-right">
                  {editable && (
                    <Button
                      variant="ghost"
                      onClick={() =>
                        run(
                          () => apiFetch(`${base}/${m.userId}`, { method: "DELETE" }),
                          `${m.name} was removed from the team.`,
                        )
                      }
                    >
                      Remove
                    </Button>
                  )}
                </Td>
              </tr>
            );
          })}
        </tbody>
      </Table>
      {canManage && (
        <form
          className="flex flex-wrap items-end gap-3 border-t border-ink-line pt-4"
          onSubmit={(e) => {
            e.preventDefault();
            if (!chosen) return;
            const suggested = defaultRoleForGrade(chosen.grade);
            const role: EngagementRole = suggested === "client" ? "viewer" : suggested;
            void run(
              () =>
                apiFetch(base, { body: { userId: chosen.id, role: hasAtLeastRole(myRole, role) ? role : "staff" } }),
              `${chosen.name} joined the team.`,
            );
            setCandidate("");
          }}
        >
          <label className="text-sm">
            <span className="mb-1 block font-medium">Add a person</span>
            <Select value={candidate} onChange={(e) => setCandidate(e.target.value)} className="w-72">
              <option value="">Choose someone from your firm…</option>
              {outside.map((p) => (
                <option key={p.id} value={p.id}>
                  {p.name} — {p.grade}
                </option>
              ))}
            </Select>
          </label>
          <Button type="submit" disabled={!chosen}>
            Add to team
          </Button>
        </form>
      )}
    </div>
  );
}

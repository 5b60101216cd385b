"use client";
import Link from "next/link";
import type { ColumnDef } from "@tanstack/react-table";
import { DataTable } from "@/components/ui/data-table";
import { EmptyState } from "@/components/ui/card";
import { Badge } from "@/components/ui/badge";
import { Amount } from "@/components/ui/amount";
import { Alert } from "@/components/ui/alert";
import { useApi } from "@/components/ui/use-api";
import type { EngagementForUser } from "@/lib/data/engagements";
import { statusTone, STATUS_LABELS } from "./status";
import { formatDate } from "@/lib/format/date";

const columns: ColumnDef<EngagementForUser, unknown>[] = [
  {
    accessorKey: "clientName",
    header: "Client",
    cell: ({ row }) => (
      <Link href={`/engagements/${row.original.id}`} className="font-medium text-ink hover:text-ledger-600 link">
        {row.original.clientName}
        <span className="block text-xs font-normal text-ink-faint">{row.original.name}</span>
      </Link>
    ),
  },
  {
    accessorKey: "periodEnd",
    header: "Period end",
    cell: ({ getValue }) => <span className="whitespace-nowrap">{formatDate(String(getValue()))}</span>,
  },
  {
    accessorKey: "performanceMateriality",
    header: "Performance materiality",
    meta: { align: "right" },
    sortingFn: (a, b) => Number(a.original.performanceMateriality) - Number(b.original.performanceMateriality),
    cell: ({ row }) => <Amount value={row.original.performanceMateriality} currency={row.original.currency} />,
  },
  {
    accessorKey: "status",
    header: "Status",
    cell: ({ row }) => <Badge tone={statusTone(row.original.status)}>{STATUS_LABELS[row.original.status]}</Badge>,
  },
  {
    accessorKey: "myRole",
    header: "Your role",
    cell: ({ getValue }) => <span className="capitalize">{String(getValue())}</span>,
  },
  {
    accessorKey: "teamSize",
    header: "Team",
    meta: { align: "right" },
    cell: ({ getValue }) => <span className="figures">{String(getValue())}</span>,
  },
];

export function EngagementList() {
  const { data: answer, error } = useApi<{ engagements: EngagementForUser[] }>("/api/engagements");
  const data = answer?.engagements;
  if (error && !data) return <Alert>{error.message}</Alert>;
  if (!data) return <div aria-busy="true" className="h-40 animate-pulse rounded-card bg-paper-sunk" />;
  return (
    <DataTable
      data={data}
      columns={columns}
      label="Engagements"
      filterPlaceholder="Filter by client, period, status…"
      empty={
        <EmptyState title="You are not on any engagement yet">
          A manager or partner adds you to an engagement&rsquo;s team.
        </EmptyState>
      }
    />
  );
}

"use client";
import { useState } from "react";
import { useRouter } from "next/navigation";
import { useForm, type Resolver } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import type { ClientContact } from "@/lib/data/members";
import {
  CreateRequestListSchema,
  REQUEST_NEED_LABELS,
  REQUEST_NEEDS,
  type CreateRequestList,
  type CreateRequestListInput,
} from "@/lib/validation/requests";
import { apiFetch, ApiError } from "@/components/ui/api";
import { Alert } from "@/components/ui/alert";
import { Amount } from "@/components/ui/amount";
import { Button } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { Field, Input, Select, Textarea } from "@/components/ui/field";
import { InviteContactForm } from "./invite-contact-form";

interface ItemOption {
  id: number;
  itemRef: string;
  description: string | null;
  bookValue: string;
}
type Values = Omit<CreateRequestListInput, "items" | "showBookValues"> & { chosen: string[]; showBookValues: boolean };

const schemaResolver = zodResolver(CreateRequestListSchema);

interface Props {
  engagementId: number;
  sampleId: number;
  items: ItemOption[];
  contacts: ClientContact[];
  defaultDue: string;
}

/** A new request list: who it goes to, which items, what is needed, by when, and whether the client sees book values. */
export function RequestListForm({ engagementId, sampleId, items, contacts: initialContacts, defaultDue }: Props) {
  const router = useRouter();
  const [contacts, setContacts] = useState(initialContacts);
  const [allItems, setAllItems] = useState(true);
  const [failure, setFailure] = useState<string | null>(null);
  const resolver: Resolver<Values, unknown, CreateRequestList> = (values, ctx, opts) => {
    const { chosen, ...rest } = values;
    return schemaResolver({ ...rest, items: allItems ? "all" : chosen.map(Number) }, ctx, opts as never);
  };
  const {
    register,
    handleSubmit,
    setValue,
    setError,
    formState: { errors, isSubmitting },
  } = useForm<Values, unknown, CreateRequestList>({
    resolver,
    defaultValues: {
      title: "Supporting documents for selected items",
      contactUserId: contacts[0] ? String(contacts[0].userId) : "",
      dueDate: defaultDue,
      needs: ["invoice"],
      chosen: [],
      showBookValues: false,
      message: "",
      needsNote: "",
    },
  });
  const submit = handleSubmit(async (body) => {
    setFailure(null);
    try {
      const r = await apiFetch<{ requestList: { id: number } }>(
        `/api/engagements/${engagementId}/samples/${sampleId}/requests`,
        { body },
      );
      router.push(`/engagements/${engagementId}/samples/${sampleId}/requests/${r.requestList.id}`);
    } catch (err) {
      if (err instanceof ApiError && err.fields)
        for (const [k, m] of Object.entries(err.fields))
          setError((k === "items" ? "chosen" : k) as keyof Values, { message: m[0] });
      setFailure((err as Error).message);
    }
  });
  const itemsError =
    (errors as Record<string, { message?: string } | undefined>).items?.message ?? errors.chosen?.message;
  return (
    <div className="grid gap-6 lg:grid-cols-[1.4fr_1fr]">
      <Card title="Request list">
        <form onSubmit={submit} noValidate className="space-y-4" aria-label="New request list">
          {failure && <Alert>{failure}</Alert>}
          <Field label="Title" error={errors.title?.message}>
            <Input {...register("title")} />
          </Field>
          <div className="grid gap-4 sm:grid-cols-2">
            <Field
              label="Client contact"
              error={errors.contactUserId?.message}
              hint={contacts.length ? undefined : "Invite a contact first (on the right)"}
            >
              <Select {...register("contactUserId")}>
                {contacts.length === 0 && <option value="">No client contact yet</option>}
                {contacts.map((c) => (
                  <option key={c.userId} value={c.userId}>
                    {c.name} — {c.email}
                  </option>
                ))}
              </Select>
            </Field>
            <Field label="Due date" error={errors.dueDate?.message}>
              <Input type="date" {...register("dueDate")} />
            </Field>
          </div>
          <fieldset className="space-y-1.5">
            <legend className="text-sm font-medium">What is needed for each item</legend>
            <div className="grid gap-1 sm:grid-cols-2">
              {REQUEST_NEEDS.map((n) => (
                <label key={n} className="inline-flex items-center gap-2 text-sm">
                  <input type="checkbox" value={n} {...register("needs")} />
                  {REQUEST_NEED_LABELS[n]}
                </label>
              ))}
            </div>
            <p aria-live="polite" className="text-xs text-brick-700">
              {errors.needs?.message}
            </p>
          </fieldset>
          <Field label="Details of what is needed (optional)" error={errors.needsNote?.message}>
            <Textarea rows={2} {...register("needsNote")} />
          </Field>
          <fieldset className="space-y-1.5">
            <legend className="text-sm font-medium">Items</legend>
            <label className="mr-4 inline-flex items-center gap-2 text-sm">
              <input type="radio" name="scope" checked={allItems} onChange={() => setAllItems(true)} />
              All {items.length} selected items
            </label>
            <label className="inline-flex items-center gap-2 text-sm">
              <input
                type="radio"
                name="scope"
                checked={!allItems}
                onChange={() => {
                  setAllItems(false);
                  setValue("chosen", []);
                }}
              />
              Only the items I tick
            </label>
            {!allItems && (
              <div className="max-h-64 overflow-y-auto rounded-md border border-ink-line">
                {items.map((it) => (
                  <label
                    key={it.id}
                    className="flex items-center gap-3 border-b border-ink-line/60 px-3 py-1.5 text-sm last:border-0"
                  >
                    <input
                      type="checkbox"
                      value={String(it.id)}
                      {...register("chosen")}
                      aria-label={`Ask for ${it.itemRef}`}
                    />
                    <span className="figures w-28">{it.itemRef}</span>
                    <span className="flex-1 truncate text-ink-soft">{it.description}</span>
                    <Amount value={it.bookValue} />
                  </label>
                ))}
              </div>
            )}
            <p aria-live="polite" className="text-xs text-brick-700">
              {itemsError}
            </p>
          </fieldset>
          <label className="flex items-start gap-2 text-sm">
            <input type="checkbox" className="mt-1" {...register("showBookValues")} />
            <span>
              Show the client each item&rsquo;s book value
              <span className="block text-xs text-ink-faint">
                Off by default: the client sees the reference and description only.
              </span>
            </span>
          </label>
          <Field label="Message to the client (optional)" error={errors.message?.message}>
            <Textarea rows={3} {...register("message")} />
          </Field>
          <Button type="submit" disabled={isSubmitting || contacts.length === 0}>
            {isSubmitting ? "Sending…" : "Send the request list"}
          </Button>
        </form>
      </Card>
      <Card title="Client contacts">
        <div className="space-y-4">
          {contacts.length > 0 && (
            <ul className="text-sm" aria-label="Client contacts">
              {contacts.map((c) => (
                <li key={c.userId} className="py-1">
                  {c.name}{" "}
                  <span className="text-ink-faint">
                    — {c.email}
                    {c.invitationPending ? " · invitation not yet accepted" : ""}
                  </span>
                </li>
              ))}
            </ul>
          )}
          <InviteContactForm
            engagementId={engagementId}
            onInvited={(userId, next) => {
              setContacts(next);
              setValue("contactUserId", String(userId));
            }}
          />
        </div>
      </Card>
    </div>
  );
}

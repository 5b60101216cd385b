"use client";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import type { z } from "zod";
import { InviteClientContactSchema, type InviteClientContactInput } from "@/lib/validation/requests";
import type { ClientContact } from "@/lib/data/members";
import { apiFetch, ApiError } from "@/components/ui/api";
import { Button } from "@/components/ui/button";
import { Field, Input } from "@/components/ui/field";

type Output = z.output<typeof InviteClientContactSchema>;

/** Invites a client contact to the engagement (senior and above); the new contact gets an e-mail with a link. */
export function InviteContactForm({
  engagementId,
  onInvited,
}: {
  engagementId: number;
  onInvited: (contact: ClientContact["userId"], contacts: ClientContact[]) => void;
}) {
  const [message, setMessage] = useState<{ ok: boolean; text: string } | null>(null);
  const {
    register,
    handleSubmit,
    reset,
    setError,
    formState: { errors, isSubmitting },
  } = useForm<InviteClientContactInput, unknown, Output>({ resolver: zodResolver(InviteClientContactSchema) });
  const submit = handleSubmit(async (body) => {
    setMessage(null);
    try {
      const r = await apiFetch<{
        contact: { userId: number; name: string; email: string; invitationSent: boolean };
        contacts: ClientContact[];
      }>(`/api/engagements/${engagementId}/client-contacts`, { body });
      setMessage({
        ok: true,
        text: r.contact.invitationSent
          ? `${r.contact.name} was invited; an e-mail is on its way to ${r.contact.email}.`
          : `${r.contact.name} was added, but the e-mail could not be sent.`,
      });
      reset();
      onInvited(r.contact.userId, r.contacts);
    } catch (err) {
      if (err instanceof ApiError && err.fields)
        for (const [k, m] of Object.entries(err.fields))
          if (k === "name" || k === "email") setError(k, { message: m[0] });
      setMessage({ ok: false, text: (err as Error).message });
    }
  });
  return (
    <form onSubmit={submit} noValidate className="space-y-2" aria-label="Invite a client contact">
      <div className="grid gap-3 sm:grid-cols-2">
        <Field label="Contact's name" error={errors.name?.message}>
          <Input {...register("name")} />
        </Field>
        <Field label="Contact's e-mail" error={errors.email?.message}>
          <Input type="email" {...register("email")} />
        </Field>
      </div>
      <Button type="submit" variant="secondary" disabled={isSubmitting}>
        {isSubmitting ? "Inviting…" : "Invite the contact"}
      </Button>
      <p aria-live="polite" className={`text-sm ${message?.ok ? "text-ledger-700" : "text-brick-700"}`}>
        {message?.text}
      </p>
    </form>
  );
}

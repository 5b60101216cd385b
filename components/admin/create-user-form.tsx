"use client";
import { useState } from "react";
import { useRouter } from "next/navigation";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import type { z } from "zod";
import { CreateUserSchema } from "@/lib/validation/user";
import { GRADE_LABELS, GRADES } from "@/lib/auth/roles";
import { Field, Input, Select } from "@/components/ui/field";
import { Button } from "@/components/ui/button";
import { Alert } from "@/components/ui/alert";
import { apiFetch, ApiError } from "@/components/ui/api";

type FormIn = z.input<typeof CreateUserSchema>;

export function CreateUserForm() {
  const router = useRouter();
  const [failure, setFailure] = useState<string | null>(null);
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors, isSubmitting },
  } = useForm<FormIn, unknown, z.output<typeof CreateUserSchema>>({
    resolver: zodResolver(CreateUserSchema),
    defaultValues: { grade: "staff", firmRole: "member" },
  });
  const onSubmit = handleSubmit(async (values) => {
    setFailure(null);
    try {
      const { invitationSent } = await apiFetch<{ invitationSent: boolean }>("/api/users", { body: values });
      router.push(`/admin/users?invited=${encodeURIComponent(values.name)}${invitationSent ? "" : "&mail=failed"}`);
      router.refresh();
    } catch (err) {
      if (err instanceof ApiError && err.fields)
        for (const [f, m] of Object.entries(err.fields)) setError(f as keyof FormIn, { message: m[0] });
      setFailure((err as Error).message);
    }
  });
  return (
    <form onSubmit={onSubmit} noValidate className="grid max-w-2xl gap-x-6 gap-y-1 sm:grid-cols-2">
      {failure && (
        <div className="sm:col-span-2">
          <Alert>{failure}</Alert>
        </div>
      )}
      <Field label="Name" error={errors.name?.message}>
        <Input {...register("name")} />
      </Field>
      <Field label="E-mail" error={errors.email?.message}>
        <Input type="email" {...register("email")} />
      </Field>
      <Field
        label="Grade"
        error={errors.grade?.message}
        hint="Client contacts are invited from an engagement's request lists, not here"
      >
        <Select {...register("grade")}>
          {GRADES.filter((g) => g !== "client").map((g) => (
            <option key={g} value={g}>
              {GRADE_LABELS[g]}
            </option>
          ))}
        </Select>
      </Field>
      <Field label="Firm role" error={errors.firmRole?.message}>
        <Select {...register("firmRole")}>
          <option value="member">Member</option>
          <option value="admin">Administrator</option>
        </Select>
      </Field>
      <p className="text-sm text-ink-soft sm:col-span-2">
        The person is e-mailed a link to choose their own password (valid once, for 14 days). You never see or type it.
      </p>
      <div className="sm:col-span-2">
        <Button type="submit" disabled={isSubmitting}>
          {isSubmitting ? "Inviting…" : "Invite by e-mail"}
        </Button>
      </div>
    </form>
  );
}

"use client";
import { useState } from "react";
import { useRouter } from "next/navigation";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { z } from "zod";
import { AcceptInvitationSchema } from "@/lib/validation/requests";
import { apiFetch } from "@/components/ui/api";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Field, Input } from "@/components/ui/field";

const FormSchema = AcceptInvitationSchema.extend({ confirm: z.string() }).refine((v) => v.password === v.confirm, {
  message: "The two passwords differ",
  path: ["confirm"],
});
type FormValues = z.infer<typeof FormSchema>;

export function InvitationForm({ token, client }: { token: string; client: boolean }) {
  const router = useRouter();
  const [failure, setFailure] = useState<string | null>(null);
  const {
    register,
    handleSubmit,
    formState: { errors, isSubmitting },
  } = useForm<FormValues>({ resolver: zodResolver(FormSchema) });
  const submit = handleSubmit(async ({ password }) => {
    setFailure(null);
    try {
      await apiFetch(`/api/invitations/${encodeURIComponent(token)}`, { body: { password } });
      router.push(client ? "/sign-in?callbackUrl=%2Frequests&welcome=1" : "/sign-in?welcome=1");
    } catch (err) {
      setFailure((err as Error).message);
    }
  });
  return (
    <form onSubmit={submit} noValidate className="space-y-3">
      {failure && <Alert>{failure}</Alert>}
      <Field label="New password" error={errors.password?.message} hint="At least 12 characters">
        <Input type="password" autoComplete="new-password" {...register("password")} />
      </Field>
      <Field label="Repeat the password" error={errors.confirm?.message}>
        <Input type="password" autoComplete="new-password" {...register("confirm")} />
      </Field>
      <Button type="submit" disabled={isSubmitting} className="w-full">
        {isSubmitting ? "Saving…" : "Save my password"}
      </Button>
    </form>
  );
}

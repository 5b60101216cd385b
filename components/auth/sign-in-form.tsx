"use client";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { signIn } from "next-auth/react";
import type { z } from "zod";
import { SignInSchema } from "@/lib/validation/user";
import { Field, Input } from "@/components/ui/field";
import { Button } from "@/components/ui/button";
import { Alert } from "@/components/ui/alert";

type Form = z.input<typeof SignInSchema>;

export function SignInForm({ callbackUrl }: { callbackUrl: string }) {
  const [failure, setFailure] = useState<string | null>(null);
  const {
    register,
    handleSubmit,
    formState: { errors, isSubmitting },
  } = useForm<Form, unknown, z.output<typeof SignInSchema>>({ resolver: zodResolver(SignInSchema) });

  const onSubmit = handleSubmit(async (values) => {
    setFailure(null);
    const result = await signIn("credentials", { ...values, redirect: false });
    if (!result || result.error) {
      setFailure(
        result?.error && result.error !== "CredentialsSignin"
          ? result.error
          : "That e-mail and password do not match an account.",
      );
      return;
    }
    window.location.assign(callbackUrl);
  });

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-2">
      {failure && <Alert>{failure}</Alert>}
      <Field label="E-mail" error={errors.email?.message}>
        <Input type="email" autoComplete="username" {...register("email")} />
      </Field>
      <Field label="Password" error={errors.password?.message}>
        <Input type="password" autoComplete="current-password" {...register("password")} />
      </Field>
      <Button type="submit" className="w-full" disabled={isSubmitting}>
        {isSubmitting ? "Signing in…" : "Sign in"}
      </Button>
    </form>
  );
}

import type { Metadata } from "next";
import { Logo } from "@/components/shell/logo";
import { SignInForm } from "@/components/auth/sign-in-form";
import { JudgementNote } from "@/components/shell/judgement-note";

export const metadata: Metadata = { title: "Sign in" };

function safeCallback(value: string | string[] | undefined): string {
  const v = Array.isArray(value) ? value[0] : value;
  return v && v.startsWith("/") && !v.startsWith("//") ? v : "/"; // "/" sends each person to their own start page
}

export default async function SignInPage({
  searchParams,
}: {
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  const params = await searchParams;
  return (
    <div className="grid min-h-screen lg:grid-cols-[1.1fr_1fr]">
      <aside className="relative hidden overflow-hidden bg-ledger-900 p-12 text-ledger-50 lg:flex lg:flex-col lg:justify-between">
        <div
          aria-hidden
          className="absolute inset-0 opacity-[0.08]"
          style={{ backgroundImage: "repeating-linear-gradient(0deg, #fff 0 1px, transparent 1px 28px)" }}
        />
        <p className="relative text-sm font-semibold uppercase tracking-[0.2em] text-ledger-100">Sondage</p>
        <div className="relative max-w-md">
          <h1 className="text-3xl font-semibold leading-tight text-white">
            Every item chosen by chance. Every choice re-performable.
          </h1>
          <p className="mt-4 text-ledger-100/90">
            Load a ledger, draw a monetary-unit or random sample from a recorded seed, key in what you audited, and see
            the projected misstatement against what you can tolerate.
          </p>
        </div>
        <p className="figures relative text-xs text-ledger-100/70">
          seed · interval · tainting · upper misstatement limit
        </p>
      </aside>
      <main className="flex items-center justify-center px-6 py-12">
        <div className="w-full max-w-sm">
          <Logo className="mb-8" />
          <h2 className="text-xl font-semibold">Sign in to your firm&rsquo;s workspace</h2>
          <p className="mb-6 mt-1 text-sm text-ink-soft">
            Use the account your firm administrator created for you, or the password you chose from your invitation.
          </p>
          {params.welcome === "1" && (
            <p
              role="status"
              className="mb-4 rounded-md border border-ledger-100 bg-ledger-50 px-3 py-2 text-sm text-ledger-700"
            >
              Your password is saved. Sign in with it now.
            </p>
          )}
          <SignInForm callbackUrl={safeCallback(params.callbackUrl)} />
          <JudgementNote className="mt-10" />
        </div>
      </main>
    </div>
  );
}

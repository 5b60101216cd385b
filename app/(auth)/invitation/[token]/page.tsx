import type { Metadata } from "next";
import { loadInvitationPage } from "@/lib/views/request-pages";
import { Logo } from "@/components/shell/logo";
import { Alert } from "@/components/ui/alert";
import { InvitationForm } from "@/components/requests/invitation-form";

export const metadata: Metadata = { title: "Choose your password" };

/** Public: where an invited person (a client contact, or a member of the firm after an invitation or a reset) chooses a password with their one-time link. */
export default async function InvitationPage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  const invitation = await loadInvitationPage(token);
  return (
    <main className="flex min-h-screen items-center justify-center px-6 py-12">
      <div className="w-full max-w-sm">
        <Logo className="mb-8" />
        {invitation ? (
          <>
            <h1 className="text-xl font-semibold">Welcome, {invitation.name}</h1>
            <p className="mb-6 mt-1 text-sm text-ink-soft">
              Choose a password for {invitation.email}.{" "}
              {invitation.grade === "client"
                ? "You will use it to sign in and send documents to your auditors."
                : "You will use it to sign in to your firm\u2019s Sondage workspace."}
            </p>
            <InvitationForm token={token} client={invitation.grade === "client"} />
          </>
        ) : (
          <Alert>
            This invitation link is not valid any more (used, expired or mistyped). Ask the audit team to invite you
            again.
          </Alert>
        )}
      </div>
    </main>
  );
}

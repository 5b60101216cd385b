import Link from "next/link";
import { requireClientPageUser } from "@/lib/auth/page-guards";
import { Logo } from "@/components/shell/logo";
import { SignOutButton } from "@/components/shell/sign-out-button";

/** The client's own room: their request lists and nothing of the audit workspace. */
export default async function ClientLayout({ children }: { children: React.ReactNode }) {
  const user = await requireClientPageUser();
  return (
    <div className="flex min-h-screen flex-col">
      <header className="border-b border-ink-line bg-paper-raised/90">
        <div className="mx-auto flex h-14 max-w-4xl items-center gap-6 px-6">
          <Link href="/requests" aria-label="Sondage, my requests"><Logo /></Link>
          <nav aria-label="Main" className="text-sm"><Link href="/requests" className="rounded-md px-2.5 py-1.5 text-ink-soft hover:bg-paper-sunk hover:text-ink">My requests</Link></nav>
          <div className="ml-auto flex items-center gap-3">
            <div className="text-right leading-tight">
              <p className="text-sm font-medium" data-testid="signed-in-as">{user.name}</p>
              <p className="text-xs text-ink-faint">Client contact</p>
            </div>
            <SignOutButton />
          </div>
        </div>
      </header>
      <main className="mx-auto w-full max-w-4xl flex-1 px-6 py-8">{children}</main>
      <footer className="border-t border-ink-line">
        <p className="mx-auto max-w-4xl px-6 py-4 text-xs text-ink-faint">Files you upload here go to your auditors only. Accepted types: PDF, images, Excel, Word, e-mail messages, CSV and text, up to 25 MB each.</p>
      </footer>
    </div>
  );
}

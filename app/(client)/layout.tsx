import { requireClientPageUser } from "@/lib/auth/page-guards";
import { ShellBar } from "@/components/shell/top-bar";

/** The client's own room, under the shell's top bar: their request lists and nothing of the audit workspace. */
export default async function ClientLayout({ children }: { children: React.ReactNode }) {
  const user = await requireClientPageUser();
  return (
    <div className="flex min-h-screen flex-col">
      <ShellBar
        home={{ href: "/requests", label: "Sondage, my requests" }}
        links={[{ href: "/requests", label: "My requests" }]}
        who={{ name: user.name, role: "Client contact" }}
        width="max-w-4xl"
      />
      <main className="mx-auto w-full max-w-4xl flex-1 px-6 py-8">{children}</main>
      <footer className="border-t border-ink-line">
        <p className="mx-auto max-w-4xl px-6 py-4 text-xs text-ink-faint">
          Files you upload here go to your auditors only. Accepted types: PDF, images, Excel, Word, e-mail messages, CSV
          and text, up to 25 MB each.
        </p>
      </footer>
    </div>
  );
}

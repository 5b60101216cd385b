import { requireWorkspaceUser } from "@/lib/auth/page-guards";
import { TopBar } from "@/components/shell/top-bar";
import { loadInboxPage } from "@/lib/views/workspace-pages";
import { JudgementNote } from "@/components/shell/judgement-note";

export default async function WorkspaceLayout({ children }: { children: React.ReactNode }) {
  const user = await requireWorkspaceUser();
  const inbox = await loadInboxPage(user.id);
  return (
    <div className="group flex min-h-screen flex-col">
      <TopBar user={user} waiting={inbox.counts.total} />
      {/* A page that marks itself data-wide (the sample workspace) gets the width its grid needs; the top bar and footer follow it. */}
      <main className="mx-auto w-full max-w-6xl flex-1 px-6 py-8 has-[[data-wide]]:max-w-[120rem]">{children}</main>
      <footer className="border-t border-ink-line">
        <div className="mx-auto max-w-6xl px-6 py-4 group-has-[[data-wide]]:max-w-[120rem]">
          <JudgementNote />
        </div>
      </footer>
    </div>
  );
}

import Link from "next/link";
import { Logo } from "./logo";
import { SignOutButton } from "./sign-out-button";
import type { UserRecord } from "@/lib/data/users";
import { GRADE_LABELS } from "@/lib/auth/roles";

/** `waiting`: how many samples wait for the user (the inbox), shown beside its link. */
export function TopBar({ user, waiting }: { user: UserRecord; waiting: number }) {
  return (
    <header className="border-b border-ink-line bg-paper-raised/90 backdrop-blur">
      <div className="mx-auto flex h-14 max-w-6xl items-center gap-6 px-6">
        <Link href="/engagements" aria-label="Sondage home"><Logo /></Link>
        <nav aria-label="Main" className="flex gap-1 text-sm">
          <Link href="/engagements" className="rounded-md px-2.5 py-1.5 text-ink-soft hover:bg-paper-sunk hover:text-ink">Engagements</Link>
          <Link href="/inbox" className="inline-flex items-center gap-1.5 rounded-md px-2.5 py-1.5 text-ink-soft hover:bg-paper-sunk hover:text-ink">
            Inbox{waiting > 0 && <><span className="figures rounded-full bg-amber-100 px-1.5 text-xs font-semibold text-amber-700" data-testid="inbox-count">{waiting.toLocaleString("en-US")}</span><span className="sr-only"> waiting for you</span></>}
          </Link>
          {user.firmRole === "admin" && <Link href="/admin/users" className="rounded-md px-2.5 py-1.5 text-ink-soft hover:bg-paper-sunk hover:text-ink">People</Link>}
          {user.firmRole === "admin" && <Link href="/admin/methodology" className="rounded-md px-2.5 py-1.5 text-ink-soft hover:bg-paper-sunk hover:text-ink">Methodology</Link>}
        </nav>
        <div className="ml-auto flex items-center gap-3">
          <div className="text-right leading-tight">
            <p className="text-sm font-medium" data-testid="signed-in-as">{user.name}</p>
            <p className="text-xs text-ink-faint">{GRADE_LABELS[user.grade]}{user.firmRole === "admin" ? " · firm administrator" : ""}</p>
          </div>
          <SignOutButton />
        </div>
      </div>
    </header>
  );
}

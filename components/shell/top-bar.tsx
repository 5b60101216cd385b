import Link from "next/link";
import { Logo } from "./logo";
import { SignOutButton } from "./sign-out-button";
import type { UserRecord } from "@/lib/data/users";
import { GRADE_LABELS } from "@/lib/auth/roles";

export interface ShellLink {
  href: string;
  label: string;
  badge?: React.ReactNode;
}

const link =
  "inline-flex items-center gap-1.5 rounded-md px-2.5 py-1.5 text-ink-soft hover:bg-paper-sunk hover:text-ink";

/**
 * The shell's top bar, for the audit workspace and the client's room alike: the logo home, the main
 * links, who is signed in (name and what they are) and the sign-out button. `width` matches the page's.
 */
export function ShellBar({
  home,
  links,
  who,
  width = "max-w-6xl",
}: {
  home: { href: string; label: string };
  links: ShellLink[];
  who: { name: string; role: string };
  width?: "max-w-4xl" | "max-w-6xl";
}) {
  return (
    <header className="border-b border-ink-line bg-paper-raised/90 backdrop-blur">
      <div className={`mx-auto flex h-14 ${width} items-center gap-6 px-6 group-has-[[data-wide]]:max-w-[120rem]`}>
        <Link href={home.href} aria-label={home.label}>
          <Logo />
        </Link>
        <nav aria-label="Main" className="flex gap-1 text-sm">
          {links.map((l) => (
            <Link key={l.href} href={l.href} className={link}>
              {l.label}
              {l.badge}
            </Link>
          ))}
        </nav>
        <div className="ml-auto flex items-center gap-3">
          <div className="text-right leading-tight">
            <p className="text-sm font-medium" data-testid="signed-in-as">
              {who.name}
            </p>
            <p className="text-xs text-ink-faint">{who.role}</p>
          </div>
          <SignOutButton />
        </div>
      </div>
    </header>
  );
}

/** The workspace's top bar. `waiting`: how many samples wait for the user (the inbox), shown beside its link. */
export function TopBar({ user, waiting }: { user: UserRecord; waiting: number }) {
  const admin = user.firmRole === "admin";
  const inboxBadge = waiting > 0 && (
    <>
      <span
        className="figures rounded-full bg-amber-100 px-1.5 text-xs font-semibold text-amber-700"
        data-testid="inbox-count"
      >
        {waiting.toLocaleString("en-US")}
      </span>
      <span className="sr-only"> waiting for you</span>
    </>
  );
  const links: ShellLink[] = [
    { href: "/engagements", label: "Engagements" },
    { href: "/inbox", label: "Inbox", badge: inboxBadge },
    ...(admin
      ? [
          { href: "/admin/users", label: "People" },
          { href: "/admin/methodology", label: "Methodology" },
        ]
      : []),
  ];
  return (
    <ShellBar
      home={{ href: "/engagements", label: "Sondage home" }}
      links={links}
      who={{ name: user.name, role: `${GRADE_LABELS[user.grade]}${admin ? " · firm administrator" : ""}` }}
    />
  );
}

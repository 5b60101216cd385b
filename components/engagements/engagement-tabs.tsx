import Link from "next/link";

const TABS = [
  { id: "overview", label: "Overview", path: "" },
  { id: "misstatements", label: "Summary of misstatements", path: "/misstatements" },
  { id: "team", label: "Team", path: "/team" },
] as const;

/** The engagement's pages as tabs: links (each is its own page), the current one marked for assistive technology. */
export function EngagementTabs({
  engagementId,
  current,
}: {
  engagementId: number;
  current: (typeof TABS)[number]["id"];
}) {
  return (
    <nav aria-label="Engagement" className="mb-6 flex gap-1 border-b border-ink-line">
      {TABS.map((t) => (
        <Link
          key={t.id}
          href={`/engagements/${engagementId}${t.path}`}
          aria-current={t.id === current ? "page" : undefined}
          className={`-mb-px border-b-2 px-4 py-2.5 text-sm font-medium transition-colors ${t.id === current ? "border-ledger-600 text-ink" : "border-transparent text-ink-soft hover:text-ink"}`}
        >
          {t.label}
        </Link>
      ))}
    </nav>
  );
}

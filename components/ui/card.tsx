export function Card({
  title,
  action,
  children,
  className = "",
}: {
  title?: string;
  action?: React.ReactNode;
  children: React.ReactNode;
  className?: string;
}) {
  return (
    <section className={`rounded-card border border-ink-line bg-paper-raised shadow-card ${className}`}>
      {(title || action) && (
        <header className="flex items-center justify-between gap-4 border-b border-ink-line px-5 py-3">
          {title && <h2 className="text-sm font-semibold uppercase tracking-wider text-ink-soft">{title}</h2>}
          {action}
        </header>
      )}
      <div className="px-5 py-4">{children}</div>
    </section>
  );
}

export function EmptyState({ title, children }: { title: string; children?: React.ReactNode }) {
  return (
    <div className="rounded-card border border-dashed border-ink-line bg-paper px-6 py-10 text-center">
      <p className="font-medium text-ink">{title}</p>
      {children && <div className="mt-1 text-sm text-ink-soft">{children}</div>}
    </div>
  );
}
